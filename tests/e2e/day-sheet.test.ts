import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { APP_URL, hydrated, launch, screenshot, signIn } from './browser.ts';
import { appDatabase } from '../integration/helpers/db.ts';
import { publishedDay, fakeTextsTo, type PublishedDay } from '../integration/day-sheet/fixture.ts';
import { queueArrivalTexts, sendDueMessages } from '../../src/lib/messaging/arrival-texts.ts';
import { emailDaySheets } from '../../src/lib/messaging/day-sheet-mail.ts';
import { sessionCookie, call } from '../integration/helpers/api.ts';

// A published day of our own on 2027-07-13 for farrier4, published the evening before (22:00 EDT).
const DATE = '2027-07-13';
const PHONES = { consenting: '+13645550121', optedOut: '+13645550122', second: '+13645550123' };
let knex: Knex;
let day: PublishedDay;

beforeAll(async () => {
  knex = appDatabase();
  day = await publishedDay(knex, {
    date: DATE,
    farrierEmail: 'farrier4@demo.test',
    tag: 'Browsertest',
    firstArrivalUtc: `${DATE}T12:20:00Z`,
    owners: [
      { name: 'Linnea Marchbank', phone: PHONES.consenting, consent: true, horses: [{ name: 'Pepper', work: ['Full set', 'Hot fit'], shoeSize: '1 all round', secondPerson: true, notes: 'Fidgets for the hinds; a haynet helps.' }, { name: 'Dill', work: ['Trim'] }] },
      { name: 'Osric Penhallow', phone: PHONES.optedOut, consent: true, optedOut: true, horses: [{ name: 'Sage', work: ['Reset'] }] },
      { name: 'Wren Castlemere', phone: PHONES.second, consent: true, horses: [{ name: 'Thistle', work: ['Therapeutic'] }] },
    ],
  });
  // Dispatch's publish wires these same calls; here the plan rows are ours, so the test makes them.
  await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, new Date(`${DATE}T02:00:00Z`)));
  await sendDueMessages(knex, new Date(`${DATE}T12:00:00Z`), { planId: day.planId });
  await emailDaySheets(knex, { practiceId: 1, planId: day.planId });
});
afterAll(async () => {
  await knex.destroy();
});

describe('the day sheet in a browser', () => {
  it('publishing the day leaves one text per consenting owner stop in the fake inbox, none for the opted-out owner', async () => {
    expect(await fakeTextsTo(PHONES.consenting)).toHaveLength(1);
    expect(await fakeTextsTo(PHONES.second)).toHaveLength(1);
    expect(await fakeTextsTo(PHONES.optedOut)).toHaveLength(0);
    expect((await fakeTextsTo(PHONES.consenting))[0]!.body).toContain('Pepper and Dill');
  });

  it('a farrier on a phone starts the day with an odometer reading, marks the first stop done, offline marks follow on reconnect, comes back home with a reading, and the dispatcher and the review see it', async () => {
    const browser = await launch({ viewport: { width: 390, height: 844 }, isMobile: true });
    try {
      const { page, context } = browser;
      await signIn(page, 'farrier4@demo.test');
      // The phone's clock on the day itself, so every mark carries a time of that day.
      await page.clock.setFixedTime(new Date(`${DATE}T12:05:00Z`));
      await page.goto(`${APP_URL}/day/${DATE}`);
      await hydrated(page);

      // Leaving home: Start the day with the odometer as written in the mileage log.
      const marks = page.locator('[data-testid="day-marks"]');
      await expect(marks.textContent()).resolves.toContain('mileage log for tax is your own record');
      await expect(marks.textContent()).resolves.toContain('Driving hours and tiredness');
      await page.evaluate(() => document.querySelector('section[aria-label="Day totals"]')?.scrollIntoView({ block: 'start' }));
      await screenshot(page, 'day-sheet-phone-start');
      await marks.locator('#odometer').fill('45 210');
      await marks.getByRole('button', { name: 'Start the day' }).click();
      await page.waitForFunction(() => document.querySelector('[data-testid="day-marks"]')?.getAttribute('data-day-state') === 'started');
      await page.waitForFunction(() => document.querySelector('[data-testid="sync-status"]')?.textContent?.includes('all marks sent'));
      await expect(marks.textContent()).resolves.toMatch(/Left home 8:05am · odometer 45,210 mi/);
      await page.evaluate(() => document.querySelector('section[aria-label="Day totals"]')?.scrollIntoView({ block: 'start' }));
      await screenshot(page, 'day-sheet-phone-started');
      await page.clock.setFixedTime(new Date(`${DATE}T13:45:00Z`));
      const first = page.locator(`[data-stop-id="${day.stopIds[0]}"]`);
      await expect(first.locator('details.directions ol li').first().textContent()).resolves.toMatch(/Set off|Turn|Bear|Keep|Go straight/);
      await expect(first.textContent()).resolves.toContain('Hot fit: burns');
      await page.waitForSelector('.day-map[data-map-ready="true"]', { timeout: 30_000 }).catch(() => undefined);
      await screenshot(page, 'day-sheet-phone');

      await first.getByRole('button', { name: 'Done' }).click();
      await page.waitForFunction((id) => document.querySelector(`[data-stop-id="${id}"]`)?.getAttribute('data-state') === 'done', day.stopIds[0]);
      await page.waitForFunction(() => document.querySelector('[data-testid="sync-status"]')?.textContent?.includes('all marks sent'));

      // The connection drops: a mark stays queued on the phone, then goes once the signal is back.
      await page.clock.setFixedTime(new Date(`${DATE}T15:05:00Z`));
      await context.setOffline(true);
      const second = page.locator(`[data-stop-id="${day.stopIds[1]}"]`);
      await second.getByRole('button', { name: 'Arrived' }).click();
      await page.waitForFunction(() => document.querySelector('[data-testid="sync-status"]')?.textContent?.includes('1 mark waiting'));
      await screenshot(page, 'day-sheet-phone-offline');
      expect(await knex('visit_logs').where({ stop_id: day.stopIds[1] })).toHaveLength(0);

      // Still in the dead spot, the page is reloaded (a closed tab, a phone that dropped it): the copy
      // the phone kept opens, showing the mark the server confirmed and the one still waiting.
      await page.waitForFunction(async (id) => {
        const kept = await (await caches.open('roundsmith-day-pages-v1')).match(location.href);
        return !!kept && new RegExp(`data-stop-id="${id}" data-state="done"`).test(await kept.text());
      }, day.stopIds[0]);
      // A change on the server that the phone cannot have seen shows the page did not come from it.
      const farrierName = (await knex('farriers').where({ id: day.farrierId }).first('name')).name;
      await knex('farriers').where({ id: day.farrierId }).update({ name: 'Renamed While Offline' });
      const reopened = await page.reload().finally(() => knex('farriers').where({ id: day.farrierId }).update({ name: farrierName }));
      expect(reopened?.fromServiceWorker()).toBe(true);
      expect(await page.textContent('main')).toContain(`${farrierName}'s day sheet`);
      await hydrated(page);
      await page.waitForSelector('[data-testid="offline-copy"]');
      expect(await page.locator('[data-testid="offline-copy"]').textContent()).toMatch(/Showing the sheet as loaded (at|\w{3} \d{1,2} \w{3},) \d{1,2}:\d{2}(am|pm)\. Marks you make are kept on this phone/);
      expect(await first.getAttribute('data-state')).toBe('done');
      expect(await second.getAttribute('data-state')).toBe('arrived');
      await page.waitForFunction(() => document.querySelector('[data-testid="sync-status"]')?.textContent?.includes('1 mark waiting'));
      await page.evaluate(() => document.querySelector('[data-testid="sync-status"]')?.scrollIntoView({ block: 'start' }));
      await screenshot(page, 'day-sheet-phone-offline-reopened');
      // "Day sheet" in the navigation (/day, today) opens the kept copy; a day never opened here says so.
      await page.goto(`${APP_URL}/day`);
      expect(new URL(page.url()).pathname).toBe(`/day/${DATE}`);
      const never = await page.goto(`${APP_URL}/day/2031-01-06`);
      expect(never?.status()).toBe(503);
      expect(await page.textContent('body')).toContain('was not opened on this phone');
      await page.goto(`${APP_URL}/day/${DATE}`);
      await hydrated(page);
      expect(await knex('visit_logs').where({ stop_id: day.stopIds[1] })).toHaveLength(0);
      await context.setOffline(false);
      await page.evaluate(() => window.dispatchEvent(new Event('online')));
      await page.waitForFunction(() => document.querySelector('[data-testid="sync-status"]')?.textContent?.includes('all marks sent'), undefined, { timeout: 30_000 });
      // Online, "Day sheet" (/day) passes through the worker to the server's redirect to today.
      const today = await page.goto(`${APP_URL}/day`);
      expect(today?.status()).toBe(200);
      expect(new URL(page.url()).pathname).toMatch(/^\/day\/\d{4}-\d{2}-\d{2}$/);
      await page.goto(`${APP_URL}/day/${DATE}`);
      await hydrated(page);
      // A reload replays nothing twice: still one visit log per stop.
      await page.reload();
      await hydrated(page);
      expect(await knex('visit_logs').where({ stop_id: day.stopIds[1] })).toHaveLength(1);
      expect(await knex('visit_logs').where({ stop_id: day.stopIds[0] })).toHaveLength(1);

      // Back home with the evening's reading: 45,262 − 45,210 = 52 mi.
      await page.clock.setFixedTime(new Date(`${DATE}T18:40:00Z`));
      await marks.locator('#odometer').fill('45262');
      await marks.getByRole('button', { name: 'Back home' }).click();
      await page.waitForFunction(() => document.querySelector('[data-testid="day-marks"]')?.getAttribute('data-day-state') === 'ended');
      await page.waitForFunction(() => document.querySelector('[data-testid="sync-status"]')?.textContent?.includes('all marks sent'));
      await expect(marks.textContent()).resolves.toMatch(/Back home 2:40pm · odometer 45,262 mi · 6 h 35 min out/);
      await expect(marks.textContent()).resolves.toContain('52 mi by odometer');
      await page.evaluate(() => document.querySelector('section[aria-label="Day totals"]')?.scrollIntoView({ block: 'start' }));
      await screenshot(page, 'day-sheet-phone-home');
      const log = await knex('day_logs').where({ farrier_id: day.farrierId, work_date: DATE }).first();
      // 52 × 1,609.344 m = 83,685.888 m → 83,686 m (international mile, 1959 agreement).
      expect(log).toMatchObject({ start_odometer: 45_210, end_odometer: 45_262, distance_m: 83_686, distance_source: 'odometer', start_source: 'marked' });

      await page.emulateMedia({ media: 'print' });
      await page.screenshot({ path: '.data/screenshots/day-sheet-print.png', fullPage: true });
      await page.emulateMedia({ media: 'screen' });

      // Signing out leaves no day sheet on the phone for the next person to open.
      expect(await page.evaluate(() => caches.has('roundsmith-day-pages-v1'))).toBe(true);
      await Promise.all([page.waitForURL((url) => url.pathname.startsWith('/sign-in')), page.evaluate(() => (document.querySelector('form[action="/sign-out"]') as HTMLFormElement).submit())]);
      await page.waitForFunction(async () => !(await caches.has('roundsmith-day-pages-v1')));
    } finally {
      await browser.close();
    }

    const progress = await call('GET', `/api/visits?date=${DATE}`, { cookie: await sessionCookie('dispatcher@demo.test') });
    const route = progress.body.routes.find((r: { farrierId: number }) => r.farrierId === day.farrierId);
    expect(route.stops[0].state).toBe('done');
    expect(route.stops[1].state).toBe('arrived');

    // The lead's review of that week (Monday 12 July 2027) counts the marked day.
    const review = await call('GET', '/api/review?from=2027-07-12&to=2027-07-18', { cookie: await sessionCookie('lead@demo.test') });
    expect(review.status).toBe(200);
    const row = review.body.farriers.find((f: { farrierId: number }) => f.farrierId === day.farrierId);
    // 12:05Z → 18:40Z = 6 h 35 min = 395 min (the route has no break); 83,686 m / 1,609.344 = 52.0 mi, measured.
    expect(row).toMatchObject({ actualMinutes: 395, actualDistance: 52, plannedDistanceDays: 0, daysWorked: 1 });
  });

  it('the dispatcher’s board shows the farrier’s marks on the stop cards', async () => {
    const browser = await launch({ viewport: { width: 1400, height: 900 } });
    try {
      await signIn(browser.page, 'dispatcher@demo.test');
      await browser.page.goto(`${APP_URL}/dispatch?date=${DATE}`);
      await hydrated(browser.page);
      await browser.page.waitForSelector('[data-progress="done"]');
      expect(await browser.page.locator('[data-progress="done"]').first().innerText()).toMatch(/^Done \d\d:\d\d$/);
      expect(await browser.page.locator('[data-progress="arrived"]').count()).toBeGreaterThan(0);
      await screenshot(browser.page, 'dispatch-progress-marks');
    } finally {
      await browser.close();
    }
  });

  it('the dispatcher sees the texts on the Messages page', async () => {
    const browser = await launch({ viewport: { width: 1280, height: 900 } });
    try {
      await signIn(browser.page, 'dispatcher@demo.test');
      await browser.page.goto(`${APP_URL}/messages?date=${DATE}`);
      await hydrated(browser.page);
      const list = await browser.page.locator('[data-testid="message-list"]').textContent();
      expect(list).toContain('Pepper and Dill');
      expect(list).toContain('farrier4@demo.test');
      await screenshot(browser.page, 'messages-page');
    } finally {
      await browser.close();
    }
  });
});
