// The dispatch screen's map and board in a real browser: a barn picked on either shows on the other,
// and the map frames the day's routes. What the map shows is read back from maplibre when it settles
// (the container's data-selected-barn, data-route-lines and data-bounds), not echoed from React props.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { APP_URL, hydrated, screenshot } from './browser.ts';
import { dispatchBrowserDay, openDispatch } from './dispatch-day.ts';
import type { PlanView } from '../../src/schemas/plans.ts';

const day = dispatchBrowserDay(6);
const { date } = day;

type Box = [west: number, south: number, east: number, north: number];
type Line = { farrierId: number; coordinates: [number, number][] };

const MAP = '[data-map-ready="true"]';

/** Web Mercator's y for a latitude (unscaled): the map's vertical axis is linear in it, not in latitude. */
const mercatorY = (lat: number) => Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));

function boxOf(points: [number, number][]): Box {
  const lons = points.map((p) => p[0]);
  const lats = points.map((p) => p[1]);
  return [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)];
}

/** How much of `outer` the box `inner` spans, across (longitude) and down (Mercator y), as fractions. */
function spans([w, s, e, n]: Box, [ow, os, oe, on]: Box) {
  return { across: (e - w) / (oe - ow), down: (mercatorY(n) - mercatorY(s)) / (mercatorY(on) - mercatorY(os)) };
}

/** Where a point is on the page, from the map's visible bounds and its canvas box (the map is not rotated). */
function project([lon, lat]: [number, number], [w, s, e, n]: Box, canvas: { x: number; y: number; width: number; height: number }) {
  return {
    x: canvas.x + ((lon - w) / (e - w)) * canvas.width,
    y: canvas.y + ((mercatorY(n) - mercatorY(lat)) / (mercatorY(n) - mercatorY(s))) * canvas.height,
  };
}

/** The route lines the page fetched for the shown plan, once the map has drawn all of them and settled. */
async function drawnLines(page: Page, answer: Promise<{ json(): Promise<{ lines: Line[] }> }>): Promise<{ lines: Line[]; bounds: Box }> {
  const lines = (await (await answer).json()).lines.filter((l) => l.coordinates.length >= 2);
  await page.waitForSelector(`${MAP}[data-route-lines="${lines.length}"]`, { timeout: 60_000 });
  // The lines can be drawn a frame before the map re-frames to them (on a reload the plan's lines may
  // arrive before the map has loaded): wait for a settled view that frames them as expectFramed
  // checks, or for the time-out, after which the checks below say what is wrong.
  const box = boxOf(lines.flatMap((l) => l.coordinates));
  await page.waitForFunction(([selector, [w, s, e, n]]) => {
    const b = document.querySelector(selector)?.getAttribute('data-bounds')?.split(',').map(Number);
    if (!b || b.length !== 4) return false;
    const y = (lat: number) => Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360));
    const inside = w >= b[0] && e <= b[2] && s >= b[1] && n <= b[3];
    return inside && Math.max((e - w) / (b[2] - b[0]), (y(n) - y(s)) / (y(b[3]) - y(b[1]))) > 0.6;
  }, [MAP, box] as const, { timeout: 15_000 }).catch(() => undefined);
  const bounds = (await page.getAttribute(MAP, 'data-bounds'))!.split(',').map(Number);
  expect(bounds).toHaveLength(4);
  return { lines, bounds: bounds as Box };
}

/**
 * The map shows every point of every route line, framed tightly: fitting a box with 48 px of padding on
 * each side leaves the routes spanning the map's width or height less 96 px, e.g. (360 − 96) / 360 ≈ 0.73
 * of the 360 px map's height, so at least 0.6 across or down.
 */
function expectFramed(lines: Line[], bounds: Box) {
  const [w, s, e, n] = bounds;
  const points = lines.flatMap((l) => l.coordinates);
  expect(points.filter(([lon, lat]) => lon < w || lon > e || lat < s || lat > n)).toEqual([]);
  const { across, down } = spans(boxOf(points), bounds);
  expect(Math.max(across, down)).toBeGreaterThan(0.6);
}

const linesOf = (page: Page) => page.waitForResponse((r) => /\/api\/plans\/\d+\/lines/.test(r.url()) && r.ok(), { timeout: 120_000 });

describe('the dispatch map and board', () => {
  it('frames the day\'s routes, and a barn picked on the board or on the map is selected on both', async () => {
    const { page } = day.browser;
    await openDispatch(page, date);
    await page.waitForSelector('[data-testid=no-plan]');
    await page.waitForSelector(MAP, { timeout: 60_000 });

    const planned = page.waitForResponse((r) => r.request().method() === 'POST' && new URL(r.url()).pathname === '/api/plans' && r.ok(), { timeout: 120_000 });
    const linesAnswer = linesOf(page);
    await page.click('[data-testid=plan-button]');
    const plan: PlanView = await (await planned).json();
    const { lines, bounds } = await drawnLines(page, linesAnswer);
    expect(lines.length).toBeGreaterThanOrEqual(3);
    expectFramed(lines, bounds);
    await page.waitForSelector('[data-lane] [data-stop]');
    await screenshot(page, 'dispatch-map-board-framed');

    // Board → map: click the first stop of the first lane; its card and the map's barn are selected.
    const routes = plan.routes.filter((r) => r.stops.length > 0);
    const first = routes[0]!.stops[0]!.barnId;
    await page.locator(`[data-lane="${routes[0]!.farrierId}"] [data-stop][data-barn="${first}"]`).first().click();
    await page.waitForSelector(`[data-stop][data-barn="${first}"][aria-current="true"]`);
    await page.waitForSelector(`${MAP}[data-selected-barn="${first}"]`);
    const selectedCards = () => page.locator('[data-barn][aria-current="true"]').evaluateAll((els) => [...new Set(els.map((el) => el.getAttribute('data-barn')))]);
    expect(await selectedCards()).toEqual([String(first)]);
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'dispatch-map-board-card-picked');

    // Map → board: click another farrier's stop barn where the map draws it, away from the map's edges
    // and legend and from every other barn, so that the click can only pick that barn.
    const barns = (await day.knex('barns').where({ practice_id: 1 }).whereNull('archived_at').select('id', 'lat', 'lon')).map((b: { id: number; lat: string; lon: string }) => ({ id: b.id, at: [Number(b.lon), Number(b.lat)] as [number, number] }));
    const canvas = (await page.locator(`${MAP} .maplibregl-canvas`).boundingBox())!;
    const onPage = new Map(barns.map((b) => [b.id, project(b.at, bounds, canvas)]));
    const target = routes.slice(1).flatMap((r) => r.stops.map((st) => st.barnId)).find((id) => {
      const p = onPage.get(id)!;
      const inside = p.x > canvas.x + 60 && p.x < canvas.x + canvas.width - 60 && p.y > canvas.y + 40 && p.y < canvas.y + canvas.height - 40;
      const clearOfLegend = !(p.x < canvas.x + 220 && p.y < canvas.y + 140);
      const alone = barns.every((b) => b.id === id || Math.hypot(onPage.get(b.id)!.x - p.x, onPage.get(b.id)!.y - p.y) > 20);
      return id !== first && inside && clearOfLegend && alone;
    });
    expect(target).toBeDefined();
    const point = onPage.get(target!)!;
    await page.mouse.click(point.x, point.y);
    await page.waitForSelector(`${MAP}[data-selected-barn="${target}"]`);
    await page.waitForSelector(`[data-stop][data-barn="${target}"][aria-current="true"]`);
    expect(await selectedCards()).toEqual([String(target)]);
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'dispatch-map-board-barn-picked');

    // This day's routes together reach across the whole region, where framing the routes and framing
    // every barn look alike. Keep only the route that covers least of the region (taking the other
    // farriers' jobs off the plan): the map, opened again, must frame that one route.
    const region = boxOf(barns.map((b) => b.at));
    const coverage = (l: Line) => {
      const { across, down } = spans(boxOf(l.coordinates), region);
      return Math.max(across, down);
    };
    const kept = [...lines].sort((a, b) => coverage(a) - coverage(b))[0]!;
    // Fitted to the region instead, this route would span at most half of it in either direction.
    expect(coverage(kept)).toBeLessThan(0.5);
    const moves = routes.filter((r) => r.farrierId !== kept.farrierId).flatMap((r) => r.stops.flatMap((st) => st.jobs.map((j) => ({ jobId: j.id, toFarrierId: null }))));
    const edited = await page.request.patch(`${APP_URL}/api/plans/${plan.id}`, { data: { version: plan.version, moves } });
    expect(edited.status()).toBe(200);
    const keptLines = linesOf(page);
    await page.reload();
    await hydrated(page);
    const one = await drawnLines(page, keptLines);
    expect(one.lines.map((l) => l.farrierId)).toEqual([kept.farrierId]);
    expectFramed(one.lines, one.bounds);
    await screenshot(page, 'dispatch-map-board-one-route');
  }, 240_000);
});
