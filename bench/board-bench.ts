/**
 * Board benchmark (prints figures, asserts nothing): the dispatch board in Debian's chromium with a
 * plan of 300 stops. Against a running app (APP_URL) whose database (DATABASE_URL) is a scratch bench
 * database (its name must start with roundsmith_bench, because the bench rewrites jobs and plans there).
 *  1. Makes sure the database is migrated and holds the demo practice, then writes a draft plan for a
 *     far-future Monday straight into plans/routes/stops/stop_jobs: 300 horses of the demo practice, one
 *     stop each, dealt round-robin over the practice's farriers (six lanes of 50).
 *  2. Opens /dispatch on that day as the dispatcher and collects requestAnimationFrame deltas in the
 *     page while a card is dragged with the mouse, and while one is dragged with the keyboard.
 *  3. Times each drop: from the pointer-up (or the dropping Space key) in the page to the first frame
 *     that shows the moved work in its new place (a lane marked as re-timing, before the server's
 *     answer), and to the first frame after the board shows the plan's next version (re-timed).
 * Prints p50/p95 frame ms per way of dragging (all frames of a drag's recording, and split into those
 * before the drop and those from the drop until the re-timed plan has shown), the longest frame after
 * each keyboard key press by kind (lift, to another lane, within the lane, drop), drop-to-render ms, plus
 * the load average.
 * With BOARD_TRACE=1 the first mouse and the first keyboard drag are also recorded with chromium's
 * tracing and JS sampling profiler, and the bench prints where the page's main thread spent that time
 * (script, style, layout, paint …) and the scripts and functions with the most self time; the traces
 * are kept in .data/board-trace-mouse.json and -keyboard.json for chromium's performance panel.
 * Run: APP_URL=… DATABASE_URL=mysql://…/roundsmith_bench_dispatch node --import tsx bench/board-bench.ts
 */
import { writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import type { CDPSession, Page } from 'playwright-core';
import { createKnex } from '../src/lib/db/connection.ts';
import { seed } from '../seeds/01_demo_practice.ts';
import { addDays, isoWeekday, localSecToDate } from '../src/lib/dispatch/time.ts';
import { hydrated, launch, screenshot, signIn } from '../tests/e2e/browser.ts';

const APP = process.env.APP_URL;
const DB_URL = process.env.DATABASE_URL;
if (!APP || !DB_URL) throw new Error('Set APP_URL and DATABASE_URL (of the app under test)');
if (!new URL(DB_URL).pathname.slice(1).startsWith('roundsmith_bench')) throw new Error('DATABASE_URL must name a roundsmith_bench… database: this bench rewrites plans and jobs');
const STOPS = Number(process.env.BOARD_STOPS ?? 300);
const ROUNDS = 3;
const TRACE = process.env.BOARD_TRACE === '1';

const knex = createKnex(DB_URL, { min: 0, max: 2 });
const load = () => os.loadavg().map((x) => x.toFixed(2)).join(' ');
const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))] ?? NaN;
};

/** Writes the 300-stop draft for `date` (replacing an earlier bench plan for that day); returns its id. */
async function writeBigPlan(db: Knex, date: string): Promise<number> {
  const practice = await db('practices').where({ id: 1 }).first();
  const tz: string = practice.time_zone;
  const old = await db('plans').where({ practice_id: 1, plan_date: date }).first('id');
  if (old) {
    const ids = (await db('stop_jobs').where({ plan_id: old.id }).select('job_id')).map((r: { job_id: number }) => r.job_id);
    if (ids.length) await db('jobs').whereIn('id', ids).update({ state: 'due', pinned_farrier_id: null, pinned_position: null });
    await db('plans').where({ id: old.id }).delete();
  }
  const farriers: { id: number; shift_start_minute: number }[] = await db('farriers').where({ practice_id: 1 }).whereNull('archived_at').orderBy('id');
  // Horses whose open job (if any) is free: state due and in no plan. Others get a fresh due job.
  const horses: { id: number; barn_id: number; minutes: number }[] = await db('horses as h')
    .where('h.practice_id', 1).whereNull('h.archived_at')
    .whereNotExists(db('jobs as j').join('stop_jobs as sj', 'sj.job_id', 'j.id').whereRaw('j.horse_id = h.id').whereIn('j.state', ['due', 'planned', 'booked', 'in_progress']))
    .orderBy(['h.barn_id', 'h.id']).limit(STOPS).select('h.id', 'h.barn_id', db.raw('45 as minutes'));
  if (horses.length < STOPS) throw new Error(`Only ${horses.length} horses are free for the bench plan`);
  const open = new Map<number, number>((await db('jobs').whereIn('horse_id', horses.map((h) => h.id)).whereIn('state', ['due', 'planned', 'booked', 'in_progress']).select('horse_id', 'id')).map((r: { horse_id: number; id: number }) => [r.horse_id, r.id]));
  const fresh = horses.filter((h) => !open.has(h.id)).map((h) => ({ practice_id: 1, horse_id: h.id, minutes: h.minutes, due_on: date, state: 'due' }));
  for (let i = 0; i < fresh.length; i += 200) await db('jobs').insert(fresh.slice(i, i + 200));
  const jobOf = new Map<number, number>((await db('jobs').whereIn('horse_id', horses.map((h) => h.id)).whereIn('state', ['due', 'planned', 'booked', 'in_progress']).select('horse_id', 'id')).map((r: { horse_id: number; id: number }) => [r.horse_id, r.id]));
  const jobIds = horses.map((h) => jobOf.get(h.id)!);
  await db('jobs').whereIn('id', jobIds).update({ state: 'planned' });

  const [planId] = await db('plans').insert({ practice_id: 1, plan_date: date, state: 'draft', version: 1, figures: JSON.stringify({ unplanned: [], warnings: {} }), created_by: null });
  const lanes = farriers.map((f) => ({ farrier: f, horses: [] as typeof horses }));
  horses.forEach((h, i) => lanes[i % lanes.length]!.horses.push(h));
  for (const lane of lanes) {
    // 9 minutes a stop from the shift start: 50 stops fill 7 h 30.
    const at = (min: number) => localSecToDate(date, (lane.farrier.shift_start_minute + min) * 60, tz);
    const n = lane.horses.length;
    const [routeId] = await db('routes').insert({
      practice_id: 1, plan_id: planId, farrier_id: lane.farrier.id, start_at: at(0), end_at: at(n * 9 + 10),
      drive_seconds: n * 180, distance_m: n * 2500, work_seconds: n * 540 + 600, overtime_seconds: 0, break_start_at: null,
    });
    for (let i = 0; i < n; i++) {
      const h = lane.horses[i]!;
      const [stopId] = await db('stops').insert({
        practice_id: 1, route_id: routeId, position: i + 1, barn_id: h.barn_id, arrival_at: at(i * 9 + 3), start_at: at(i * 9 + 3),
        departure_at: at(i * 9 + 9), leg_drive_seconds: 180, leg_distance_m: 2500, window_start_at: null, window_end_at: null,
      });
      await db('stop_jobs').insert({ stop_id: stopId, job_id: jobOf.get(h.id)!, plan_id: planId, position: 1 });
    }
  }
  return Number(planId);
}

type TraceEvent = { name: string; ph: string; dur?: number; pid: number; tid: number; args?: { name?: string } };
type ProfileNode = { id: number; callFrame: { functionName: string; url: string; lineNumber: number; columnNumber: number } };

/** Starts chromium tracing (timeline categories) and the JS sampling profiler on the page. */
async function startTrace(page: Page): Promise<CDPSession> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
  await cdp.send('Profiler.start');
  await cdp.send('Tracing.start', { categories: 'devtools.timeline,disabled-by-default-devtools.timeline', transferMode: 'ReturnAsStream' });
  return cdp;
}

/**
 * Ends the trace and prints the renderer main thread's time by kind of work, and the profiler's top
 * self times by script file and by function (names are minified in a built app; file:line still tells).
 */
async function endTrace(cdp: CDPSession, label: string): Promise<void> {
  const done = new Promise<string>((resolve) => cdp.once('Tracing.tracingComplete', (e) => resolve(e.stream!)));
  await cdp.send('Tracing.end');
  const stream = await done;
  let text = '';
  for (;;) {
    const chunk = await cdp.send('IO.read', { handle: stream, size: 1 << 20 });
    text += chunk.base64Encoded ? Buffer.from(chunk.data, 'base64').toString() : chunk.data;
    if (chunk.eof) break;
  }
  await cdp.send('IO.close', { handle: stream });
  writeFileSync(path.resolve('.data', `board-trace-${label}.json`), text);
  const { profile } = await cdp.send('Profiler.stop');
  await cdp.detach();

  const parsed = JSON.parse(text) as { traceEvents?: TraceEvent[] } | TraceEvent[];
  const events = Array.isArray(parsed) ? parsed : parsed.traceEvents ?? [];
  const mains = new Set(events.filter((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain').map((e) => `${e.pid}:${e.tid}`));
  const sums = new Map<string, number>();
  for (const e of events) {
    if (e.ph !== 'X' || !mains.has(`${e.pid}:${e.tid}`)) continue;
    sums.set(e.name, (sums.get(e.name) ?? 0) + (e.dur ?? 0) / 1000);
  }
  const kinds = ['RunTask', 'EventDispatch', 'FunctionCall', 'FireAnimationFrame', 'TimerFire', 'RunMicrotasks', 'UpdateLayoutTree', 'Layout', 'PrePaint', 'Paint', 'Layerize', 'HitTest', 'ScrollLayer', 'IntersectionObserverController::computeIntersections', 'MinorGC', 'MajorGC'];
  console.log(`  [trace ${label}] main thread ms (events nest: script includes the layouts it forces): ${kinds.filter((k) => sums.has(k)).map((k) => `${k} ${sums.get(k)!.toFixed(0)}`).join(', ')}`);

  const nodes = new Map<number, ProfileNode>((profile.nodes as ProfileNode[]).map((n) => [n.id, n]));
  const self = new Map<number, number>();
  const samples = profile.samples ?? [];
  const deltas = profile.timeDeltas ?? [];
  for (let i = 0; i < samples.length; i++) self.set(samples[i]!, (self.get(samples[i]!) ?? 0) + (deltas[i + 1] ?? 0) / 1000);
  const byFile = new Map<string, number>();
  const byFn = new Map<string, number>();
  for (const [id, ms] of self) {
    const f = nodes.get(id)!.callFrame;
    const file = f.url ? f.url.slice(f.url.lastIndexOf('/') + 1) : `(${f.functionName || 'native'})`;
    byFile.set(file, (byFile.get(file) ?? 0) + ms);
    const fn = `${f.functionName || '(anonymous)'} ${file}:${f.lineNumber + 1}:${f.columnNumber + 1}`;
    byFn.set(fn, (byFn.get(fn) ?? 0) + ms);
  }
  const top = (m: Map<string, number>, n: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, n).map(([k, v]) => `${k} ${v.toFixed(0)}`).join('; ');
  console.log(`  [trace ${label}] JS self ms by file: ${top(byFile, 8)}`);
  console.log(`  [trace ${label}] JS self ms by function: ${top(byFn, 12)}`);
}

// 1. The database and the plan.
await knex.migrate.latest({ directory: path.resolve('migrations'), loadExtensions: ['.ts'] });
if (!(await knex('practices').where({ id: 1 }).first('id'))) await seed(knex);
let date = addDays(new Date().toISOString().slice(0, 10), 4 * 365);
while (isoWeekday(date) !== 1) date = addDays(date, 1);
const planId = await writeBigPlan(knex, date);
await knex.destroy();

// 2. The board in the browser.
const { page, close } = await launch({ viewport: { width: 1600, height: 1000 } });
try {
  await signIn(page, 'dispatcher@demo.test');
  const t0 = Date.now();
  await page.goto(`${APP}/dispatch?date=${date}`);
  await hydrated(page);
  await page.waitForSelector('[data-lane] [data-stop]');
  // Lanes mount only the cards in and near view: count the stops from the lanes' figures.
  const cards = await page.locator('[data-lane] [data-stop]').count();
  const stopsShown = (await page.$$eval('[data-testid=lane-figures]', (els) => els.map((e) => e.textContent ?? ''))).reduce((n, t) => n + Number(/(\d+) stops/.exec(t)?.[1] ?? 0), 0);
  const firstPaintMs = Date.now() - t0;
  await page.waitForSelector('[data-map-ready="true"]', { timeout: 60_000 });
  await page.locator('[data-testid=board]').scrollIntoViewIfNeeded();
  await page.waitForTimeout(500);
  await screenshot(page, 'board-bench-300');
  // Measure from the screen as it opens (map above, the lanes' tops in view), after the map has settled.
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.waitForTimeout(2000);

  await page.evaluate(() => {
    const w = window as unknown as { __frames: number[]; __rec: boolean; __drops: number[]; __dropAt: number | null; __shown: number[]; __shownAt: number | null; __lastDrop: number; __armKey: boolean };
    w.__frames = []; w.__drops = []; w.__dropAt = null; w.__shown = []; w.__shownAt = null; w.__lastDrop = Infinity; w.__rec = false; w.__armKey = false;
    // Drop time: the event's own time stamp of the pointer-up, or of the Space key that drops a lifted card.
    window.addEventListener('pointerup', (e) => { if (w.__rec) w.__dropAt = w.__shownAt = w.__lastDrop = e.timeStamp; }, true);
    window.addEventListener('keydown', (e) => { if (w.__armKey && e.code === 'Space') { w.__armKey = false; w.__dropAt = w.__shownAt = w.__lastDrop = e.timeStamp; } }, true);
    // Each key press of a keyboard drag, by kind (lift, to another lane, within the lane, drop), for the longest frame after it.
    const k = window as unknown as { __keyKind: string | null; __keyLog: { kind: string; at: number }[] };
    k.__keyLog = [];
    window.addEventListener('keydown', (e) => {
      if (!k.__keyKind) return;
      k.__keyLog.push({ kind: k.__keyKind, at: e.timeStamp });
      k.__keyKind = null;
    }, true);
    // The moved work shown where it was dropped, before the server's answer: a lane marked as re-timing.
    new MutationObserver(() => {
      if (w.__shownAt === null || !document.querySelector('[data-retiming]')) return;
      const at = w.__shownAt;
      w.__shownAt = null;
      requestAnimationFrame(() => w.__shown.push(performance.now() - at));
    }).observe(document.querySelector('[data-testid=board]')!, { subtree: true, attributes: true, attributeFilter: ['data-retiming'] });
    const state = document.querySelector('[data-testid=plan-state]')!;
    new MutationObserver(() => {
      if (w.__dropAt === null) return;
      const at = w.__dropAt;
      w.__dropAt = null;
      requestAnimationFrame(() => w.__drops.push(performance.now() - at));
    }).observe(state, { subtree: true, characterData: true, childList: true });
  });
  // As source text: tsx would wrap a named function inside an evaluated callback with a helper the page lacks.
  const record = (on: boolean) => page.evaluate(`(() => {
    const w = window;
    w.__rec = ${on};
    if (${on}) {
      w.__frames = [];
      w.__frameAt = [];
      w.__lastDrop = Infinity;
      let last = performance.now();
      requestAnimationFrame(function tick(t) { w.__frames.push(t - last); w.__frameAt.push(t); last = t; if (w.__rec) requestAnimationFrame(tick); });
    }
  })()`);
  const version = () => page.locator('[data-testid=plan-state]').innerText();
  const nextVersion = async (before: string) => page.waitForFunction((b) => document.querySelector('[data-testid=plan-state]')?.textContent !== b, before, { timeout: 30_000 });
  const lanes = (await page.$$eval('[data-lane]', (els) => els.map((e) => e.getAttribute('data-lane')!))).filter((l) => l !== 'unplanned');

  // Every frame of a drag's recording, and split at the drop: while dragging, and from the drop until the re-timed plan has shown.
  const mouseFrames: number[] = [], mouseDrag: number[] = [], mouseAfter: number[] = [];
  const keyFrames: number[] = [], keyDrag: number[] = [], keyAfter: number[] = [];
  const perKey: Record<string, number[]> = {};
  const frames = () => page.evaluate(() => {
    const w = window as unknown as { __frames: number[]; __frameAt: number[]; __lastDrop: number };
    return { ms: w.__frames.slice(1), at: w.__frameAt.slice(1), drop: w.__lastDrop };
  });
  const collect = (f: { ms: number[]; at: number[]; drop: number }, all: number[], drag: number[], after: number[]) => {
    f.ms.forEach((ms, i) => {
      all.push(ms);
      (f.at[i]! <= f.drop ? drag : after).push(ms);
    });
  };
  const patchMs: number[] = [];
  page.on('response', async (r) => {
    if (r.request().method() === 'PATCH' && r.url().includes('/api/plans/')) patchMs.push(Number((await r.json()).retimeMs));
  });
  for (let round = 0; round < ROUNDS; round++) {
    // Mouse: the first stop of one lane onto the next lane's header, 40 pointer moves on the way.
    const a = lanes[round % lanes.length]!, b = lanes[(round + 1) % lanes.length]!;
    const card = page.locator(`[data-lane="${a}"] [data-stop]`).first();
    const from = (await card.boundingBox())!;
    const to = (await page.locator(`[data-lane="${b}"] header`).boundingBox())!;
    const before = await version();
    await page.mouse.move(from.x + from.width / 2, from.y + 20);
    const mouseTrace = TRACE && round === 0 ? await startTrace(page) : null;
    await record(true);
    await page.mouse.down();
    await page.mouse.move(from.x + from.width / 2 + 20, from.y + 40, { steps: 5 });
    await page.mouse.move(to.x + to.width / 2, to.y + to.height + 30, { steps: 40 });
    await page.mouse.up();
    await nextVersion(before);
    await page.waitForTimeout(200);
    await record(false);
    if (mouseTrace) await endTrace(mouseTrace, 'mouse');
    collect(await frames(), mouseFrames, mouseDrag, mouseAfter);

    // Keyboard: the first stop of another lane, Space, ArrowRight, ArrowDown ×3, Space.
    const c = lanes[(round + 2) % lanes.length]!;
    const kCard = page.locator(`[data-lane="${c}"] [data-stop]`).first();
    await kCard.focus();
    const kBefore = await version();
    const keyTrace = TRACE && round === 0 ? await startTrace(page) : null;
    await record(true);
    const kind = (name: string) => page.evaluate((n) => { (window as unknown as { __keyKind: string }).__keyKind = n; }, name);
    await kind('lift');
    await page.keyboard.press('Space');
    await page.waitForTimeout(250);
    await kind('to another lane');
    await page.keyboard.press('ArrowRight');
    await page.waitForTimeout(250);
    for (let i = 0; i < 3; i++) {
      await kind('within the lane');
      await page.keyboard.press('ArrowDown');
      await page.waitForTimeout(150);
    }
    await page.evaluate(() => { (window as unknown as { __armKey: boolean }).__armKey = true; });
    await kind('drop');
    await page.keyboard.press('Space');
    await nextVersion(kBefore);
    await page.waitForTimeout(200);
    await record(false);
    if (keyTrace) await endTrace(keyTrace, 'keyboard');
    const kf = await frames();
    collect(kf, keyFrames, keyDrag, keyAfter);
    const log = await page.evaluate(() => (window as unknown as { __keyLog: { kind: string; at: number }[] }).__keyLog.splice(0));
    log.forEach((key, i) => {
      const until = Math.min(log[i + 1]?.at ?? Infinity, key.at + 250);
      const after = kf.ms.filter((_, j) => kf.at[j]! > key.at && kf.at[j]! <= until);
      (perKey[key.kind] ??= []).push(after.length ? Math.max(...after) : NaN);
    });
  }
  await page.waitForTimeout(300);
  const drops = await page.evaluate(() => (window as unknown as { __drops: number[] }).__drops);
  const shown = await page.evaluate(() => (window as unknown as { __shown: number[] }).__shown);
  const f = (xs: number[]) => `p50 ${pct(xs, 50).toFixed(1)} ms, p95 ${pct(xs, 95).toFixed(1)} ms, max ${Math.max(...xs).toFixed(1)} ms over ${xs.length} frames`;
  console.log(`Board with ${stopsShown} stops in ${lanes.length} lanes, ${cards} cards mounted at first (plan ${planId}, ${date}); first load to cards ${firstPaintMs} ms; load average ${load()}`);
  console.log(`  mouse drag frames: ${f(mouseFrames)}`);
  console.log(`    while dragging: ${f(mouseDrag)}; from the drop: ${f(mouseAfter)}`);
  console.log(`  keyboard drag frames: ${f(keyFrames)}`);
  console.log(`    while dragging: ${f(keyDrag)}; from the drop: ${f(keyAfter)}`);
  console.log(`    longest frame after each key press (until the next key, at most 250 ms): ${Object.entries(perKey).map(([k, xs]) => `${k} ${xs.map((x) => x.toFixed(0)).join('/')} ms`).join('; ')}`);
  console.log(`  drop to moved work shown, before the server answers (${shown.length} drops): ${shown.length ? `p50 ${pct(shown, 50).toFixed(0)} ms, max ${Math.max(...shown).toFixed(0)} ms` : 'none shown'}`);
  console.log(`  drop to re-timed render (${drops.length} drops): p50 ${pct(drops, 50).toFixed(0)} ms, max ${Math.max(...drops).toFixed(0)} ms; server re-time p50 ${pct(patchMs, 50).toFixed(1)} ms, max ${Math.max(...patchMs).toFixed(1)} ms`);
  await screenshot(page, 'board-bench-300-after');
} finally {
  await close();
}
