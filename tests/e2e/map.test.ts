// The region map in a real browser (Debian's chromium, WebGL through SwiftShader): it draws our own
// base map with road names, shows the practice's barns and homes, picks a barn on click, and every
// request the page makes stays on this machine.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import sharp from 'sharp';
import { launch, signIn, screenshot, APP_URL } from './browser.ts';

type Session = Awaited<ReturnType<typeof launch>>;

describe('region map', () => {
  let browser: Session;
  const requested: string[] = [];
  const failed: string[] = [];
  const statuses = new Map<string, number>();
  const consoleLines: string[] = [];

  beforeAll(async () => {
    browser = await launch({ viewport: { width: 1400, height: 900 } });
    // Context-wide, so requests from maplibre's web worker (tiles, glyphs) are recorded too.
    browser.context.on('request', (r) => {
      requested.push(r.url());
    });
    browser.context.on('requestfailed', (r) => {
      failed.push(`${r.url()} ${r.failure()?.errorText ?? ''}`);
    });
    browser.context.on('response', (r) => {
      statuses.set(r.url(), r.status());
    });
    await signIn(browser.page, 'dispatcher@demo.test');
    requested.length = 0;
    await browser.page.goto(`${APP_URL}/map`);
    browser.page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') consoleLines.push(`${m.type()}: ${m.text()}`);
    });
    await browser.page.waitForSelector('[data-map-ready="true"]', { timeout: 60_000 });
    await screenshot(browser.page, 'map-loaded');
    // Road names are placed once their tiles and glyphs are in: wait until some are on screen.
    await browser.page.waitForFunction(() => Number(document.querySelector('[data-road-labels]')?.getAttribute('data-road-labels') ?? 0) > 0, undefined, { timeout: 60_000 });
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('renders a non-blank map with road-name labels from our own glyphs', async () => {
    const file = await screenshot(browser.page, 'map-region');
    const labels = Number(await browser.page.getAttribute('[data-road-labels]', 'data-road-labels'));
    expect(labels).toBeGreaterThan(5);
    // The map area alone (not the page chrome): many distinct colours and no single colour covering it.
    const box = (await browser.page.locator('.maplibregl-canvas').boundingBox())!;
    const { data, info } = await sharp(readFileSync(file))
      .extract({ left: Math.round(box.x), top: Math.round(box.y), width: Math.round(box.width), height: Math.round(box.height) })
      .removeAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    const counts = new Map<number, number>();
    for (let i = 0; i < data.length; i += 3) {
      const key = (data[i]! << 16) | (data[i + 1]! << 8) | data[i + 2]!;
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    const pixels = info.width * info.height;
    expect(counts.size).toBeGreaterThan(200);
    expect(Math.max(...counts.values()) / pixels).toBeLessThan(0.9);
    // Label glyphs came from this server, as SDF ranges.
    const glyphUrls = requested.filter((u) => u.includes('/tiles/glyphs/'));
    expect(glyphUrls.length).toBeGreaterThan(0);
    for (const u of glyphUrls) expect(statuses.get(u)).toBe(200);
    // MapLibre reports a missing glyph range or a bad style or tile as a console error.
    expect(consoleLines.filter((l) => l.startsWith('error'))).toEqual([]);
  });

  it('keeps every request of the page on 127.0.0.1 or localhost', () => {
    expect(requested.length).toBeGreaterThan(5);
    const outside = requested.filter((u) => {
      const url = new URL(u);
      if (url.protocol === 'data:' || url.protocol === 'blob:') return false;
      return url.hostname !== '127.0.0.1' && url.hostname !== 'localhost';
    });
    expect(outside).toEqual([]);
    // Tile requests may fail only as cancelled (the map re-frames after loading and drops tiles it no
    // longer needs); anything else failing would mean a request went somewhere it could not reach.
    expect(failed.filter((f) => !(f.includes('/tiles/') && f.endsWith('net::ERR_ABORTED')))).toEqual([]);
    expect(requested.some((u) => /\/tiles\/\d+\/\d+\/\d+\.pbf$/.test(u))).toBe(true);
    expect(requested.some((u) => u.endsWith('/tiles/style.json'))).toBe(true);
  });

  it('opens a popup with the barn and its horses when a barn is clicked', async () => {
    // Find a pixel of a barn circle by its fill colour (the due-state colours of map-layers.ts),
    // outside the legend, and click it.
    const file = await screenshot(browser.page, 'map-before-click');
    const canvas = (await browser.page.locator('.maplibregl-canvas').boundingBox())!;
    const legend = (await browser.page.locator('text=Due later').boundingBox())!;
    const { data, info } = await sharp(readFileSync(file)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
    const targets = [[0xbe, 0x26, 0x09], [0xd2, 0xa9, 0x47], [0x74, 0x8c, 0xa8], [0x2f, 0x7d, 0x4f]];
    let hit: { x: number; y: number } | null = null;
    for (let y = Math.ceil(canvas.y) + 40; y < canvas.y + canvas.height - 40 && !hit; y += 2) {
      for (let x = Math.ceil(canvas.x) + 40; x < canvas.x + canvas.width - 80 && !hit; x += 2) {
        if (x < legend.x + 260 && y < legend.y + 120) continue;
        const i = (y * info.width + x) * 3;
        if (targets.some(([r, g, b]) => data[i] === r && data[i + 1] === g && data[i + 2] === b)) hit = { x, y };
      }
    }
    expect(hit).not.toBeNull();
    await browser.page.mouse.click(hit!.x, hit!.y);
    const popup = browser.page.locator('.maplibregl-popup');
    await popup.waitFor({ timeout: 10_000 });
    expect(await popup.innerText()).toMatch(/\d+ horses?/);
    await screenshot(browser.page, 'map-barn-popup');
  });
});
