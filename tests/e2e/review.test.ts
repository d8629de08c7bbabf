import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { launch, signIn, screenshot, hydrated, APP_URL } from './browser.ts';

type Session = Awaited<ReturnType<typeof launch>>;

/** A page figure as plain text: without currency sign and thousands separators, as the CSV writes it. */
const plain = (text: string) => text.trim().replace(/[$,]/g, '');

describe('the lead’s review in a real browser', () => {
  let browser: Session;
  beforeAll(async () => {
    browser = await launch({ viewport: { width: 1440, height: 1000 } });
    await signIn(browser.page, 'lead@demo.test');
  });
  afterAll(async () => {
    await browser.close();
  });

  it('opens a week and shows hours against the overtime line and distance per day', async () => {
    const { page } = browser;
    await page.goto(`${APP_URL}/review`);
    await hydrated(page);
    const firstTitle = await page.locator('[data-testid=range-title]').innerText();
    // Open the week before the default one.
    await page.click('button[aria-label="Previous week"]');
    await page.waitForFunction((t) => document.querySelector('[data-testid=range-title]')?.textContent !== t, firstTitle);
    await page.waitForSelector('[data-testid=review-table] tbody tr');
    await page.waitForSelector('[data-testid=hours-chart] .recharts-bar-rectangle');
    await page.waitForSelector('[data-testid=distance-chart] .recharts-bar-rectangle');
    expect(await page.locator('[data-testid=hours-chart] .recharts-reference-line').count()).toBe(1);
    expect(await page.locator('[data-testid=hours-chart]').innerText()).toContain('Overtime from 40:00 h');
    expect(await page.locator('[data-testid=hours-chart] .recharts-bar-rectangle').count()).toBeGreaterThan(6);
    expect(new URL(page.url()).searchParams.get('mode')).toBe('week');
    expect(await page.locator('.caution').innerText()).toMatch(/fatigue/i);
    // Figures are set in Roboto Mono.
    const font = await page.locator('[data-testid=review-table] td.figure').first().evaluate((el) => getComputedStyle(el).fontFamily);
    expect(font).toContain('Roboto Mono');
    await page.waitForTimeout(400); // let the chart animation settle for the screenshot
    await screenshot(page, 'review-week');
  });

  it('downloads a CSV whose rows and figures equal the table on the page', async () => {
    const { page } = browser;
    const table = await page.locator('[data-testid=review-table] tbody tr, [data-testid=review-table] tfoot tr').evaluateAll((rows) =>
      rows.map((r) => [...r.querySelectorAll('th, td')].map((c) => (c.textContent ?? '').trim())),
    );
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid=csv-link]')]);
    expect(download.suggestedFilename()).toMatch(/^review-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/);
    const csv = readFileSync((await download.path())!, 'utf8').trimEnd().split('\r\n').map((l) => l.split(','));
    expect(csv.length - 1).toBe(table.length);
    table.forEach((cells, i) => {
      expect(csv[i + 1]![0]).toBe(cells[0]);
      expect(csv[i + 1]!.slice(1)).toEqual(cells.slice(1).map(plain));
    });
    expect(table[table.length - 1]![0]).toBe('Team total');
  });

  it('opens a farrier’s days from the table and a day’s plan and actuals from there', async () => {
    const { page } = browser;
    // Other test files add farriers of their own to the shared database; take one who worked that week.
    const worked = page.locator('[data-testid=review-table] tbody tr').filter({ has: page.locator('td', { hasText: /^[1-9]\d*:\d\d$/ }) }).first();
    const name = (await worked.locator('th button').innerText()).trim();
    await worked.locator('th button').click();
    await page.waitForSelector('[data-testid=farrier-days] tbody tr');
    expect(await page.locator('[data-testid=farrier-days] h2').innerText()).toContain(name);
    await screenshot(page, 'review-farrier-days');
    await Promise.all([page.waitForURL(/\/review\/day\/\d{4}-\d{2}-\d{2}\?farrier=\d+/), page.locator('[data-testid=farrier-days] a', { hasText: 'Open day' }).first().click()]);
    const section = page.locator('[data-testid=farrier-day]');
    expect(await section.count()).toBe(1);
    expect(await section.locator('h2').innerText()).toBe(name);
    expect(await section.innerText()).toMatch(/Planned[\s\S]*Actual/);
    await screenshot(page, 'review-day-farrier');
  });

  it('opens a day from the distance chart with every farrier who worked it', async () => {
    const { page } = browser;
    await page.goBack();
    await hydrated(page);
    await page.waitForSelector('[data-testid=distance-chart] .recharts-bar-rectangle');
    const bar = page.locator('[data-testid=distance-chart] .recharts-bar-rectangle').first();
    await bar.hover();
    await Promise.all([page.waitForURL(/\/review\/day\/\d{4}-\d{2}-\d{2}$/), bar.click()]);
    expect(await page.locator('[data-testid=farrier-day]').count()).toBeGreaterThan(0);
    await screenshot(page, 'review-day-all');
  });

  it('switches to a month and shows each week against the overtime line', async () => {
    const { page } = browser;
    await page.goto(`${APP_URL}/review`);
    await hydrated(page);
    await page.click('button[aria-pressed=false]:has-text("Month")');
    await page.waitForFunction(() => /^[A-Z][a-z]{2} \d{4}$/.test(document.querySelector('[data-testid=range-title]')?.textContent ?? ''));
    await page.waitForSelector('[data-testid=hours-chart] .recharts-bar-rectangle');
    expect(await page.locator('[data-testid=hours-chart] .recharts-legend-item').count()).toBeGreaterThanOrEqual(4);
    await page.waitForTimeout(400);
    await screenshot(page, 'review-month');
  });
});
