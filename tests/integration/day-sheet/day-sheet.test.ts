import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { appDatabase } from '../helpers/db.ts';
import { APP_URL, call, sessionCookie } from '../helpers/api.ts';
import { publishedDay, type PublishedDay } from './fixture.ts';
import { emailDaySheets } from '../../../src/lib/messaging/day-sheet-mail.ts';

// A published day of our own on 2027-06-15 for farrier2 (first arrival 12:40Z = 08:40 EDT).
const DATE = '2027-06-15';
let knex: Knex;
let day: PublishedDay;
let farrier: string;

beforeAll(async () => {
  knex = appDatabase();
  day = await publishedDay(knex, {
    date: DATE,
    farrierEmail: 'farrier2@demo.test',
    tag: 'Sheettest',
    firstArrivalUtc: `${DATE}T12:40:00Z`,
    owners: [
      { name: 'Hollis Fenwright', phone: '+12705550111', consent: true, horses: [{ name: 'Bramble', work: ['Front shoes', 'Hot fit'], shoeSize: '0 front', secondPerson: true }, { name: 'Quince', work: ['Trim'], notes: 'Pads and packing left fore' }] },
      { name: 'Juniper Oakes', phone: '+12705550112', consent: true, horses: [{ name: 'Rowan', work: ['Therapeutic'] }] },
      { name: 'Perrin Ashdown', phone: '+12705550113', consent: true, horses: [{ name: 'Fennel', work: ['Trim'] }] },
    ],
  });
  farrier = await sessionCookie('farrier2@demo.test');
});
afterAll(async () => {
  await knex.destroy();
});

const page = async (path: string, cookie: string) => {
  const response = await fetch(`${APP_URL}${path}`, { headers: { cookie }, redirect: 'manual' });
  return { status: response.status, html: await response.text(), location: response.headers.get('location') };
};

describe('the day sheet page', () => {
  it('shows the farrier their stops in order with window, access notes, owner phone, horse notes, cautions and directions', async () => {
    const { status, html } = await page(`/day/${DATE}`, farrier);
    expect(status).toBe(200);
    const a = html.indexOf('Fenwright Sheettest Barn');
    const b = html.indexOf('Oakes Sheettest Barn');
    const c = html.indexOf('Ashdown Sheettest Barn');
    expect(a).toBeGreaterThan(0);
    expect(b).toBeGreaterThan(a);
    expect(c).toBeGreaterThan(b);
    expect(html).toContain('Gate code 4417');
    expect(html).toContain('tel:+12705550111');
    expect(html).toContain('Shoe size 0 front');
    expect(html).toContain('Needs a second person');
    expect(html).toContain('Pads and packing left fore');
    expect(html).toMatch(/Hot fit: burns/);
    expect(html).toMatch(/Sedation only by a vet/);
    expect(html).toMatch(/Therapeutic or lameness work/);
    // Directions from src/lib/routing start with a departure step.
    expect(html).toMatch(/Set off (north|south|east|west|north-east|north-west|south-east|south-west|[a-z-]+) on /);
    expect(html).toContain('From home');
  });

  it('shows another farrier nothing of it, and a dispatcher any farrier by ?farrier=', async () => {
    const other = await page(`/day/${DATE}`, await sessionCookie('farrier1@demo.test'));
    expect(other.html).not.toContain('Fenwright Sheettest Barn');
    expect(other.html).toContain('Nothing published for you');
    const sneaky = await page(`/day/${DATE}?farrier=${day.farrierId}`, await sessionCookie('farrier1@demo.test'));
    expect(sneaky.html).not.toContain('Fenwright Sheettest Barn');
    const dispatcher = await page(`/day/${DATE}?farrier=${day.farrierId}`, await sessionCookie('dispatcher@demo.test'));
    expect(dispatcher.html).toContain('Fenwright Sheettest Barn');
  });

  it('sends /day to today in the practice time zone', async () => {
    const r = await page('/day', farrier);
    expect(r.status).toBe(302);
    const today = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/New_York', year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date());
    expect(r.location).toBe(`/day/${today}`);
  });
});

describe('marking stops', () => {
  const mark = (body: Record<string, unknown>, cookie = farrier) => call('POST', '/api/visits', { cookie, body });

  it('records arrived then done in visit_logs once, however often the phone replays the same marks', async () => {
    const arrived = { clientKey: 'sheettest-arrive-1', stopId: day.stopIds[0], state: 'arrived', at: `${DATE}T12:55:00.000Z` };
    const done = { clientKey: 'sheettest-done-1', stopId: day.stopIds[0], state: 'done', at: `${DATE}T14:10:00.000Z` };
    expect((await mark(arrived)).status).toBe(201);
    expect((await mark(done)).status).toBe(201);
    const replay = await mark(arrived);
    expect(replay.status).toBe(200);
    expect(replay.body.replayed).toBe(true);
    expect((await mark(done)).body.replayed).toBe(true);
    const logs = await knex('visit_logs').where({ stop_id: day.stopIds[0] });
    expect(logs).toHaveLength(1);
    expect(logs[0]).toMatchObject({ state: 'done', farrier_id: day.farrierId, visit_date: DATE, client_key: 'sheettest-arrive-1' });
    expect(new Date(logs[0].arrived_at).toISOString()).toBe(`${DATE}T12:55:00.000Z`);
    expect(new Date(logs[0].departed_at).toISOString()).toBe(`${DATE}T14:10:00.000Z`);
    const jobs = await knex('jobs').whereIn('id', day.jobIds[0]!);
    expect(jobs.map((j) => j.state)).toEqual(['done', 'done']);
    const horses = await knex('visit_log_horses').where({ visit_log_id: logs[0].id });
    expect(horses).toHaveLength(2);
    // Seeded prices: front shoes 12000 + hot fit 2500 = 14500 cents.
    expect(horses.map((h) => h.revenue_cents).sort((x, y) => x - y)).toEqual([5500, 14500]);
  });

  it('applies marks in the order they were made even when an older one arrives last', async () => {
    // The done mark (made later) reaches the server before the arrived mark made earlier.
    await mark({ clientKey: 'sheettest-done-2', stopId: day.stopIds[1], state: 'done', at: `${DATE}T16:30:00.000Z` });
    await mark({ clientKey: 'sheettest-arrive-2', stopId: day.stopIds[1], state: 'arrived', at: `${DATE}T14:50:00.000Z` });
    const log = await knex('visit_logs').where({ stop_id: day.stopIds[1] }).first();
    expect(log.state).toBe('done');
    expect(new Date(log.arrived_at).toISOString()).toBe(`${DATE}T14:50:00.000Z`);
  });

  it('re-estimates the stops ahead from the actual times', async () => {
    const answer = await call('GET', `/api/visits?date=${DATE}&farrier=${day.farrierId}`, { cookie: await sessionCookie('dispatcher@demo.test') });
    expect(answer.status).toBe(200);
    const route = answer.body.routes[0];
    const third = route.stops[2];
    // Stop 2 planned 14:10Z–15:20Z, left 16:30Z (70 min late); stop 3 planned 15:40Z → 15:40 + 70 min = 16:50Z.
    expect(third.basis).toBe('estimate');
    expect(third.delaySec).toBe(70 * 60);
    expect(third.expectedArrivalAt).toBe(`${DATE}T16:50:00.000Z`);
    expect(route.stops[0].state).toBe('done');
  });

  it('requires a reason to skip, and refuses marks on another farrier route', async () => {
    const noReason = await mark({ clientKey: 'sheettest-skip-0', stopId: day.stopIds[2], state: 'skipped', at: `${DATE}T17:50:00.000Z` });
    expect(noReason.status).toBe(400);
    const other = await mark({ clientKey: 'sheettest-other-1', stopId: day.stopIds[2], state: 'arrived', at: `${DATE}T17:50:00.000Z` }, await sessionCookie('farrier1@demo.test'));
    expect(other.status).toBe(404);
    const skipped = await mark({ clientKey: 'sheettest-skip-1', stopId: day.stopIds[2], state: 'skipped', at: `${DATE}T17:55:00.000Z`, skipReason: 'Barn locked or no access' });
    expect(skipped.status).toBe(201);
    const log = await knex('visit_logs').where({ stop_id: day.stopIds[2] }).first();
    expect(log).toMatchObject({ state: 'skipped', skip_reason: 'Barn locked or no access' });
    expect((await knex('jobs').whereIn('id', day.jobIds[2]!)).map((j) => j.state)).toEqual(['skipped']);
  });
});

describe('day sheet e-mails', () => {
  it('mails the farrier the link to the day sheet once per publication', async () => {
    const first = await emailDaySheets(knex, { practiceId: 1, planId: day.planId });
    expect(first.sent).toBe(1);
    const again = await emailDaySheets(knex, { practiceId: 1, planId: day.planId });
    expect(again).toMatchObject({ sent: 0, alreadySent: 1 });
    const mails = ((await (await fetch(`${process.env.FAKES_URL}/mail`)).json()) as { mails: { to: string[]; subject: string; text: string }[] }).mails;
    const mine = mails.filter((m) => m.to.includes('farrier2@demo.test') && m.text.includes(`/day/${DATE}`));
    expect(mine).toHaveLength(1);
    expect(mine[0]!.subject).toBe('Your day sheet for Tue 15 Jun');
  });
});
