import { describe, expect, it } from 'vitest';
import { screenshot } from './browser.ts';
import { call, sessionCookie } from '../integration/helpers/api.ts';
import { dispatchBrowserDay, farrierLanes, keyboardDrag, openDispatch } from './dispatch-day.ts';

// Narrow enough that the board's lanes do not all fit: the board scrolls sideways.
const day = dispatchBrowserDay(5, { width: 1400, height: 900 });
const { date } = day;

type Route = { farrierId: number; stops: { id: number; jobs: { id: number }[] }[] };

describe('a keyboard drag on a board scrolled sideways', () => {
  it('moves a stop lifted in a lane scrolled out of the board\'s view to the next farrier\'s lane, not back into its own', async () => {
    const cookie = await sessionCookie('dispatcher@demo.test');
    const planned = await call('POST', '/api/plans', { cookie, body: { date, budgetSeconds: 1 } });
    expect(planned.status).toBe(201);

    const { page } = day.browser;
    await openDispatch(page, date);
    await page.waitForSelector('[data-lane] [data-stop]');
    const lanes = await farrierLanes(page);
    // The first farrier lane with work, and the farrier lane after it (the one ArrowRight reaches).
    const routes = planned.body.routes as Route[];
    const at = lanes.findIndex((l) => (routes.find((r) => String(r.farrierId) === l)?.stops.length ?? 0) > 0 && lanes.indexOf(l) < lanes.length - 1);
    expect(at).toBeGreaterThanOrEqual(0);
    const [source, target] = [lanes[at]!, lanes[at + 1]!];

    // Scroll the board to its far right, so the source lane is out of the board's view to the left,
    // and put the keyboard focus on its first card without scrolling it back.
    const board = page.locator('[data-testid=board]');
    await board.scrollIntoViewIfNeeded();
    const scrolled = await board.evaluate((b) => {
      b.scrollLeft = b.scrollWidth;
      return { can: b.scrollWidth - b.clientWidth, left: b.scrollLeft };
    });
    expect(scrolled.can).toBeGreaterThan(0);
    const card = page.locator(`[data-lane="${source}"] [data-stop]`).first();
    const stopId = Number(await card.getAttribute('data-stop'));
    const jobId = routes.flatMap((r) => r.stops).find((s) => s.id === stopId)!.jobs[0]!.id;
    await card.evaluate((el) => (el as HTMLElement).focus({ preventScroll: true }));
    const out = await page.evaluate(({ sel }) => {
      const b = document.querySelector('[data-testid=board]')!.getBoundingClientRect();
      const c = document.querySelector(sel)!.getBoundingClientRect();
      return c.right <= b.left;
    }, { sel: `[data-stop="${stopId}"]` });
    expect(out).toBe(true);

    // Lift, one lane to the right, drop.
    const answer = await keyboardDrag(page, 'ArrowRight', 15_000);
    expect(answer.status()).toBe(200);
    const body = await answer.json();
    const holder = (body.routes as Route[]).find((r) => r.stops.some((s) => s.jobs.some((j) => j.id === jobId)))!;
    expect(String(holder.farrierId)).toBe(target);
    await page.waitForSelector(`[data-testid=plan-state]:has-text("v${body.version}")`);
    await screenshot(page, 'dispatch-e2e-sideways');
  }, 180_000);
});
