import { describe, expect, it } from 'vitest';
import { hydrated, screenshot } from './browser.ts';
import { dispatchBrowserDay, keyboardDrag, openDispatch } from './dispatch-day.ts';

const day = dispatchBrowserDay(2);
const { date } = day;

describe('the dispatcher plans a day in the browser', () => {
  it('plans, sees routes and lanes, drags by mouse and by keyboard, publishes, and finds the same plan after a reload', async () => {
    const { page } = day.browser;
    await openDispatch(page, date);
    await page.waitForSelector('[data-testid=no-plan]');

    const linesAnswer = page.waitForResponse((r) => /\/api\/plans\/\d+\/lines/.test(r.url()) && r.status() === 200, { timeout: 60_000 });
    await page.click('[data-testid=plan-button]');
    await page.waitForSelector('[data-testid=plan-progress]');
    await page.waitForSelector('[data-lane] [data-stop]', { timeout: 60_000 });
    const lines = await (await linesAnswer).json();
    // One road-following line per farrier with stops: many more points than stops.
    expect(lines.lines.length).toBeGreaterThanOrEqual(3);
    expect(lines.lines[0].coordinates.length).toBeGreaterThan(20);
    await page.waitForSelector('[data-map-ready="true"]');
    const lanes = await page.$$eval('[data-lane]', (els) => els.map((e) => e.getAttribute('data-lane')));
    expect(lanes).toContain('unplanned');
    expect(lanes.length).toBeGreaterThanOrEqual(4);
    // Lane figures and stop times are set in Roboto Mono.
    const fonts = await page.$$eval('[data-testid=lane-figures] .figure, [data-lane] [data-stop] .figure', (els) => els.slice(0, 8).map((e) => getComputedStyle(e).fontFamily));
    expect(fonts.length).toBeGreaterThan(0);
    expect(fonts.every((f) => f.includes('Roboto Mono'))).toBe(true);
    await screenshot(page, 'dispatch-e2e-planned');

    // Mouse: drag the first stop of the first lane onto the second lane.
    const farrierLanes = lanes.filter((l) => l !== 'unplanned') as string[];
    const [laneA, laneB] = farrierLanes;
    const card = page.locator(`[data-lane="${laneA}"] [data-stop]`).first();
    const stopBarn = await card.getAttribute('data-barn');
    const from = (await card.boundingBox())!;
    const to = (await page.locator(`[data-lane="${laneB}"] header`).boundingBox())!;
    const patch1 = page.waitForResponse((r) => r.request().method() === 'PATCH' && r.url().includes('/api/plans/'));
    await page.mouse.move(from.x + from.width / 2, from.y + 20);
    await page.mouse.down();
    await page.mouse.move(from.x + from.width / 2 + 20, from.y + 40, { steps: 5 });
    await page.mouse.move(to.x + to.width / 2, to.y + to.height + 30, { steps: 15 });
    await page.mouse.up();
    expect((await patch1).status()).toBe(200);
    await page.waitForSelector(`[data-lane="${laneB}"] [data-barn="${stopBarn}"]`);

    // Keyboard: focus the first stop of the third lane, lift with Space, move right, drop with Space.
    const laneC = farrierLanes[2]!;
    const kCard = page.locator(`[data-lane="${laneC}"] [data-stop]`).first();
    const kBarn = await kCard.getAttribute('data-barn');
    await kCard.focus();
    const answer = await keyboardDrag(page, 'ArrowLeft');
    expect(answer.status()).toBe(200);
    const body = await answer.json();
    // Two edits so far (mouse, keyboard): version 1 → 3; the barn's stop now sits in another farrier's route.
    expect(body.version).toBe(3);
    const holder = body.routes.find((r: any) => r.stops.some((s: any) => String(s.barnId) === kBarn));
    expect(String(holder.farrierId)).not.toBe(laneC);
    await screenshot(page, 'dispatch-e2e-moved');

    // Publish, reload, same plan. Lanes mount only the cards in view (in the lane and in the window) and
    // a drop scrolls the receiving lane, so every lane is read from its top with the window at the top of
    // the page, with its figures, before and after.
    const shown = async () => {
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.$$eval('[data-lane-scroll]', (els) => els.forEach((e) => { e.scrollTop = 0; }));
      // Lanes follow the window's scrolling on the next frame and measure cards as they mount: read
      // until two reads a few frames apart agree.
      const read = async () => {
        await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => requestAnimationFrame(r)))));
        return page.$$eval('[data-lane]', (els) => els.map((e) => [e.getAttribute('data-lane'), e.querySelector('[data-testid=lane-figures]')?.textContent ?? '', [...e.querySelectorAll('[data-barn]')].map((c) => c.getAttribute('data-barn'))]));
      };
      let last = await read();
      for (let i = 0; i < 20; i++) {
        const next = await read();
        if (JSON.stringify(next) === JSON.stringify(last)) return next;
        last = next;
      }
      return last;
    };
    const before = await shown();
    await page.click('[data-testid=publish-button]');
    await page.waitForSelector('[data-testid=plan-state]:has-text("Published")');
    await page.reload();
    await hydrated(page);
    await page.waitForSelector('[data-testid=plan-state]:has-text("Published")');
    const after = await shown();
    expect(after).toEqual(before);
    await screenshot(page, 'dispatch-e2e-published');
  }, 180_000);
});
