// In a real browser: add a barn with a map pin, add a horse to it, upload a photo and see its
// thumbnail, import the sample CSV and see the new horses on the due list; screenshots of each screen.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { APP_URL, hydrated, launch, screenshot, signIn } from './browser.ts';

type Session = Awaited<ReturnType<typeof launch>>;
const tag = Date.now().toString(36).slice(-5);

describe('records in the browser', () => {
  let b: Session;
  beforeAll(async () => {
    b = await launch();
    await signIn(b.page, 'dispatcher@demo.test');
  });
  afterAll(async () => {
    await b.close();
  });

  it('adds a barn with a pin placed on the map, then a horse there, then a photo with its thumbnail', async () => {
    const { page } = b;
    await page.goto(`${APP_URL}/barns/new`);
    await hydrated(page);
    await page.waitForSelector('[data-map-ready="true"]', { timeout: 30_000 });
    await page.fill('#barn-name', `Dunnock Barn ${tag}`);
    await page.fill('#barn-address', '19 Dunnock Lane, Merrowdale');
    const map = page.locator('[data-map-ready="true"] canvas').first();
    await map.click({ position: { x: 200, y: 150 } });
    await page.waitForFunction(() => document.querySelector('[data-pin]')?.getAttribute('data-pin') !== '');
    const pin = await page.getAttribute('[data-pin]', 'data-pin');
    const [lat, lon] = pin!.split(',').map(Number);
    // The demo region lies around 38.2° N, 84.6° W (tiles/region.json bounds).
    expect(lat).toBeGreaterThan(37.9);
    expect(lat).toBeLessThan(38.5);
    expect(lon).toBeGreaterThan(-84.9);
    expect(lon).toBeLessThan(-84.3);
    await page.waitForTimeout(500);
    await screenshot(page, 'records-barn-new');
    await Promise.all([page.waitForURL(/\/barns\/\d+$/), page.click('button:has-text("Add barn")')]);
    await hydrated(page);
    await page.waitForSelector('[data-map-ready="true"]', { timeout: 30_000 });
    await page.waitForTimeout(500);
    await screenshot(page, 'records-barn-page');

    await Promise.all([page.waitForURL(/\/horses\/new\?barnId=\d+/), page.click('text=Add a horse here')]);
    await hydrated(page);
    await page.selectOption('#horse-owner', { index: 1 });
    await page.fill('#horse-name', `Wicket ${tag}`);
    await page.fill('#horse-cycle', '6');
    await page.fill('#horse-last', '2026-10-01');
    await page.click('label:has-text("Trim")');
    expect(await page.inputValue('#horse-barn')).not.toBe('');
    await Promise.all([page.waitForURL(/\/horses\/\d+$/), page.click('button:has-text("Add horse")')]);
    await hydrated(page);
    await expect(page.locator('h1').innerText()).resolves.toContain(`Wicket ${tag}`);

    const photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#8a6a4f' } }).composite([{ input: Buffer.from('<svg width="800" height="600"><ellipse cx="400" cy="330" rx="230" ry="190" fill="#3b3029"/><path d="M250 330 a150 150 0 0 1 300 0 v120 h-60 v-120 a90 90 0 0 0 -180 0 v120 h-60z" fill="#c9c4bb"/></svg>') }]).jpeg().toBuffer();
    await page.setInputFiles('#upload-file', { name: `hoof-${tag}.jpg`, mimeType: 'image/jpeg', buffer: photo });
    await page.click('button:has-text("Upload")');
    const thumb = page.locator(`img[alt="Photo: hoof-${tag}.jpg"]`);
    await thumb.waitFor({ timeout: 15_000 });
    await page.waitForFunction((alt) => { const img = document.querySelector(`img[alt="${alt}"]`) as HTMLImageElement | null; return Boolean(img && img.complete && img.naturalWidth > 0); }, `Photo: hoof-${tag}.jpg`);
    const width = await thumb.evaluate((img: HTMLImageElement) => img.naturalWidth);
    // 800 × 600 fitted inside 320 × 320 is 320 × 240.
    expect(width).toBe(320);
    await screenshot(page, 'records-horse-page');
  });

  it('imports the sample CSV and shows its horses on the due list', async () => {
    const { page } = b;
    await page.goto(`${APP_URL}/horses/import`);
    await hydrated(page);
    await page.setInputFiles('#import-file', 'public/samples/demo-owners.csv');
    await page.waitForSelector('text=2. Match the columns');
    await screenshot(page, 'records-import-mapping');
    await page.click('button:has-text("Check the rows")');
    await page.waitForSelector('[aria-label="Import preview"]');
    await screenshot(page, 'records-import-preview');
    await page.click('button:has-text("Import 8 horses")');
    await page.waitForSelector('p[role=status]:has-text("Imported 8 horses")');
    await page.goto(`${APP_URL}/due`);
    await hydrated(page);
    await page.fill('#due-q', 'Gingerbread');
    await page.waitForSelector('tr[data-horse="Gingerbread"]');
    await page.fill('#due-q', '');
    await page.selectOption('#due-barn', { label: 'Gorsefield Livery' });
    await page.waitForSelector('tr[data-horse="Barley Sugar"]');
    expect(await page.locator('tbody tr[data-horse]').count()).toBe(4);
    await screenshot(page, 'records-due-filtered');
    await page.selectOption('#due-barn', { index: 0 });
    await page.waitForFunction(() => document.querySelectorAll('tbody tr[data-horse]').length > 10);
    await screenshot(page, 'records-due-list');
  });

  it('shows the owners, horses, barns and work types tables', async () => {
    const { page } = b;
    for (const [path, name] of [['/owners', 'records-owners'], ['/horses', 'records-horses'], ['/barns', 'records-barns'], ['/work-types', 'records-work-types']] as const) {
      await page.goto(`${APP_URL}${path}`);
      await hydrated(page);
      await page.waitForSelector('[data-testid="table-total"]:not(:empty)');
      await screenshot(page, name);
    }
    await page.goto(`${APP_URL}/owners`);
    await hydrated(page);
    await page.waitForSelector('[data-testid="table-total"]:not(:empty)');
    await page.click('button:has-text("Add owner")');
    await page.fill('#owner-name', 'x');
    await page.fill('#owner-phone', '555-01');
    await page.click('button[type=submit]:has-text("Add owner")');
    await expect(page.locator('#owner-phone-error').innerText()).resolves.toMatch(/phone number/);
    await screenshot(page, 'records-owner-error');
  });

  it('shows the lead the farriers of the team', async () => {
    const { page } = b;
    await b.context.clearCookies();
    await signIn(page, 'lead@demo.test');
    await page.goto(`${APP_URL}/farriers`);
    await page.waitForSelector('[data-testid="table-total"]:not(:empty)');
    await page.locator('tbody tr').first().click();
    await page.waitForSelector('[data-map-ready="true"]', { timeout: 30_000 });
    await page.waitForTimeout(500);
    await screenshot(page, 'records-farriers');
  });
});
