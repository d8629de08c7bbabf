import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { APP_URL, hydrated, launch, screenshot, signIn } from './browser.ts';
import { appDatabase } from '../integration/helpers/db.ts';
import { call, sessionCookie } from '../integration/helpers/api.ts';
import { publishedDay, type PublishedDay } from '../integration/day-sheet/fixture.ts';

/*
 * A published day of our own (Tuesday 14 September 2027, a date no other test uses) for farrier4,
 * started and ended by the office with odometer readings 52,000 and 52,031 mi; the lead then corrects
 * the day on the review's day page. Demo units are miles: 1 mi = 1,609.344 m exactly (international
 * yard and pound agreement, 1959). New York is on EDT (UTC−4) in September 2027.
 */
const DATE = '2027-09-14';
let knex: Knex;
let day: PublishedDay;
let browser: Awaited<ReturnType<typeof launch>>;

beforeAll(async () => {
  knex = appDatabase();
  day = await publishedDay(knex, {
    date: DATE, farrierEmail: 'farrier4@demo.test', tag: 'Corr', firstArrivalUtc: `${DATE}T12:40:00Z`,
    owners: [{ name: 'Linnea Corrford', phone: '+12705550151', consent: false, horses: [{ name: 'Corr Bramble', work: ['Trim'] }] }],
  });
  const cookie = await sessionCookie('dispatcher@demo.test');
  const mark = (kind: 'start' | 'end', at: string, odometer: number) =>
    call('POST', '/api/day-logs', { cookie, body: { clientKey: `corr-${kind}-${DATE}`, kind, date: DATE, at, odometer, farrierId: day.farrierId } });
  expect((await mark('start', `${DATE}T12:20:00Z`, 52000)).status).toBe(201);
  expect((await mark('end', `${DATE}T17:30:00Z`, 52031)).status).toBe(201);
  browser = await launch({ viewport: { width: 1440, height: 1000 } });
  await signIn(browser.page, 'lead@demo.test');
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

describe('the lead corrects a logged day on the review', () => {
  it('shows a reason error beside its field, then saves new readings and a new end time, and the day page shows the distance worked out again', async () => {
    const { page } = browser;
    await page.goto(`${APP_URL}/review/day/${DATE}?farrier=${day.farrierId}`);
    const actualDistance = page.locator('[data-testid=farrier-day] tr:has(th:text-is("Actual")) td').last();
    // 52,031 − 52,000 = 31 mi
    expect((await actualDistance.innerText()).trim()).toBe('31.0');
    await hydrated(page); // the island hydrates once visible: a click before that reaches no React
    await page.click('[data-testid=correct-day]');
    const form = page.locator('form[aria-label^="Correct the day"]');
    // the form starts from the logged figures, on the practice's clock: 17:30Z is 13:30 EDT
    expect(await form.locator('input[name=endedAt]').inputValue()).toBe('13:30');
    expect(await form.locator('input[name=endOdometer]').inputValue()).toBe('52031');

    await form.locator('input[name=endOdometer]').fill('52041');
    await form.locator('button[type=submit]').click();
    // the error stands beside the reason field, and nothing was saved
    const reasonError = form.locator('div:has(> input[name=reason]) > .field-error');
    await reasonError.waitFor();
    expect(await reasonError.innerText()).toBe('Say why the day is corrected');
    expect(await form.locator('.field-error').count()).toBe(1);
    expect((await knex('day_logs').where({ farrier_id: day.farrierId, work_date: DATE }).first()).end_odometer).toBe(52031);

    await form.locator('input[name=endedAt]').fill('13:45');
    await form.locator('input[name=reason]').fill('Odometer misread at home');
    await Promise.all([page.waitForEvent('load'), form.locator('button[type=submit]').click()]);
    // 52,041 − 52,000 = 41 mi
    expect((await actualDistance.innerText()).trim()).toBe('41.0');
    const log = await knex('day_logs').where({ farrier_id: day.farrierId, work_date: DATE }).first();
    expect(log.end_odometer).toBe(52041);
    expect(new Date(log.ended_at).toISOString()).toBe(`${DATE}T17:45:00.000Z`); // 13:45 EDT
    expect(log.distance_source).toBe('odometer');
    const audit = await knex('audit_log').where({ entity: 'day_log', entity_id: log.id, action: 'day_log.corrected' }).first();
    expect(JSON.parse(typeof audit.detail === 'string' ? audit.detail : JSON.stringify(audit.detail)).reason).toBe('Odometer misread at home');
    await hydrated(page);
    await page.click('[data-testid=correct-day]');
    await form.waitFor();
    await screenshot(page, 'review-day-correction');
  });
});
