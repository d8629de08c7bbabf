import { describe, expect, it } from 'vitest';
import { screenshot } from './browser.ts';
import { call, sessionCookie } from '../integration/helpers/api.ts';
import { dispatchBrowserDay, farrierLanes, keyboardDrag, openDispatch } from './dispatch-day.ts';

const day = dispatchBrowserDay(4);
const { date } = day;

type Stop = { id: number; barnId: number; jobs: { id: number }[] };
type Route = { farrierId: number; stops: Stop[] };

describe('a long lane on the dispatch board', () => {
  it('keeps the cards of a long lane that are below the window\'s edge, and a stop far down the lane, out of the page until they are scrolled to, and then the stop can be dragged with the keyboard to another farrier', async () => {
    // A plan whose whole day is in one lane: plan the day, then move every other farrier's work to the
    // first lane (the board's leftmost, in view without scrolling the board sideways).
    const cookie = await sessionCookie('dispatcher@demo.test');
    const planned = await call('POST', '/api/plans', { cookie, body: { date, budgetSeconds: 1 } });
    expect(planned.status).toBe(201);
    const routes = planned.body.routes as Route[];
    const long = routes[0]!;
    const moves = routes.filter((r) => r.farrierId !== long.farrierId).flatMap((r) => r.stops.flatMap((s) => s.jobs.map((j) => ({ jobId: j.id, toFarrierId: long.farrierId }))));
    const edited = await call('PATCH', `/api/plans/${planned.body.id}`, { cookie, body: { version: planned.body.version, moves } });
    expect(edited.status).toBe(200);
    const lane = (edited.body.routes as Route[]).find((r) => r.farrierId === long.farrierId)!;
    // More stops than a lane mounts at once: about five cards fill its 70vh of a 1000-px window, plus one below.
    expect(lane.stops.length).toBeGreaterThanOrEqual(12);
    const last = lane.stops[lane.stops.length - 1]!;

    const { page } = day.browser;
    await openDispatch(page, date);
    const laneSel = `[data-lane="${long.farrierId}"]`;
    await page.waitForSelector(`${laneSel} [data-stop]`);
    // Only the cards in and near the lane's view are mounted: the last stop is not in the page yet.
    const mounted = await page.locator(`${laneSel} [data-stop]`).count();
    expect(mounted).toBeLessThan(lane.stops.length);
    expect(await page.locator(`[data-stop="${last.id}"]`).count()).toBe(0);

    // With the page at its top the lane's box reaches below the window (the board sits below the map):
    // its cards there are not mounted either, beyond one card past the window's edge (136 px, the
    // lane's card estimate). Scrolling the page down to the lane mounts them.
    const laneGeometry = () => page.evaluate((sel) => ({
      window: window.innerHeight,
      boxBottom: document.querySelector(`${sel} [data-lane-scroll]`)!.getBoundingClientRect().bottom,
      cardTops: [...document.querySelectorAll(`${sel} [data-stop]`)].map((c) => c.getBoundingClientRect().top),
    }), laneSel);
    const frames = () => page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => requestAnimationFrame(r)))));
    await page.evaluate(() => window.scrollTo(0, 0));
    await frames();
    const atTop = await laneGeometry();
    expect(atTop.boxBottom).toBeGreaterThan(atTop.window + 2 * 136);
    expect(Math.max(...atTop.cardTops)).toBeLessThanOrEqual(atTop.window + 136 + 1);
    await page.$eval(`${laneSel} [data-lane-scroll]`, (el) => el.scrollIntoView({ block: 'end' }));
    await page.waitForFunction(({ sel, n }) => document.querySelectorAll(`${sel} [data-stop]`).length > n, { sel: laneSel, n: atTop.cardTops.length }, { timeout: 10_000 });
    const inView = await laneGeometry();
    expect(inView.boxBottom).toBeLessThanOrEqual(inView.window + 1);

    // Scrolling the lane to its end brings the last stop's card in, once the lane's end is inside the
    // window too (the board sits below the map). Cards are measured as they mount, so the lane's height
    // settles as it scrolls: keep scrolling to the end, as a person would.
    await page.waitForFunction(({ sel, id }) => {
      const el = document.querySelector(`${sel} [data-lane-scroll]`)!;
      el.scrollIntoView({ block: 'end' });
      el.scrollTop = el.scrollHeight;
      return document.querySelector(`[data-stop="${id}"]`) !== null;
    }, { sel: laneSel, id: last.id }, { polling: 200, timeout: 10_000 });
    const card = page.locator(`[data-stop="${last.id}"]`);
    await card.waitFor();
    await screenshot(page, 'dispatch-e2e-long-lane');

    // Lift it with Space, move it one lane sideways (to a farrier's lane, not the unplanned one), drop with Space.
    const lanes = await farrierLanes(page);
    const at = lanes.indexOf(String(long.farrierId));
    const [key, target] = at > 0 ? (['ArrowLeft', lanes[at - 1]!] as const) : (['ArrowRight', lanes[at + 1]!] as const);
    await card.focus();
    const answer = await keyboardDrag(page, key);
    expect(answer.status()).toBe(200);
    const body = await answer.json();
    const holder = (body.routes as Route[]).find((r) => r.stops.some((s) => s.jobs.some((j) => j.id === last.jobs[0]!.id)))!;
    expect(String(holder.farrierId)).toBe(target);
    // The board shows it in the receiving lane once the re-timed plan is in.
    await page.waitForSelector(`[data-testid=plan-state]:has-text("v${body.version}")`);
    await page.waitForSelector(`[data-lane="${target}"] [data-barn="${last.barnId}"]`);
  }, 180_000);
});
