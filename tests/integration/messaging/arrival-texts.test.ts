import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { appDatabase } from '../helpers/db.ts';
import { APP_URL, call, sessionCookie } from '../helpers/api.ts';
import { publishedDay, fakeTextsTo, eventually, type PublishedDay } from '../day-sheet/fixture.ts';
import { queueArrivalTexts, sendDueMessages, visitKeyPrefix } from '../../../src/lib/messaging/arrival-texts.ts';
import { countSegments } from '../../../src/lib/messaging/segments.ts';

// A published day of our own on 2027-05-11 (a Tuesday, EDT = UTC−4): first arrival 13:07Z = 09:07 local.
const DATE = '2027-05-11';
const PHONES = { ada: '+16065550101', bea: '+16065550102', cal: '+16065550103', dee: '+16065550104' };
// Publishing happens the evening before at 22:00 EDT (02:00Z), inside quiet hours, so every text
// waits until 08:00 EDT = 12:00Z on the day: far in the future, so the app's own half-minute sender
// never races these tests; the tests send with an explicit clock instead.
const QUEUE_NOW = new Date(`${DATE}T02:00:00Z`);
const MORNING = new Date(`${DATE}T12:00:00Z`);

let knex: Knex;
let day: PublishedDay;

beforeAll(async () => {
  knex = appDatabase();
  day = await publishedDay(knex, {
    date: DATE,
    farrierEmail: 'farrier3@demo.test',
    tag: 'Msgtest',
    firstArrivalUtc: `${DATE}T13:07:00Z`,
    owners: [
      { name: 'Ada Quillfeather', phone: PHONES.ada, consent: true, horses: [{ name: 'Marigold', work: ['Trim'] }, { name: 'Tansy', work: ['Front shoes', 'Hot fit'] }] },
      { name: 'Bea Thornquist', phone: PHONES.bea, consent: true, optedOut: true, horses: [{ name: 'Nutmeg', work: ['Trim'] }] },
      { name: 'Cal Brambleton', phone: PHONES.cal, consent: false, horses: [{ name: 'Wick', work: ['Reset'] }] },
      { name: 'Dee Harrowgate', phone: PHONES.dee, consent: true, horses: [{ name: 'Sorrel', work: ['Full set'] }] },
    ],
  });
});
afterAll(async () => {
  await knex.destroy();
});

const textsOfPlan = () => knex('messages').where({ plan_id: day.planId, channel: 'sms' }).orderBy('id');

describe('arrival texts on publish', () => {
  it('queues one text per stop for each owner with consent and no opt-out, and none for the others', async () => {
    const result = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(result).toMatchObject({ queued: 2, updates: 0, notTexted: 2 });
    const rows = await textsOfPlan();
    expect(rows.map((r) => r.to_address).sort()).toEqual([PHONES.ada, PHONES.dee]);
    const ada = rows.find((r) => r.to_address === PHONES.ada)!;
    // Stop 1 planned 09:07 EDT → 09:00, 60-minute window → 8:30am–9:30am; both of Ada's horses named.
    expect(ada.body).toContain('between 8:30am and 9:30am');
    expect(ada.body).toContain('Marigold and Tansy');
    expect(ada.body).toContain('Reply STOP to opt out');
    expect(ada.body).toContain('Tue 11 May');
    // Stored segment count equals an independent count of the stored body (3GPP TS 23.038 rules).
    expect(ada.segments).toBe(countSegments(ada.body).segments);
    expect(ada.encoding).toBe('gsm7');
    // Stop 4 planned 13:07Z + 3 × 90 min = 17:37Z = 13:37 EDT → 13:30; width 60 + 3 × 15 = 105 → 120 → 12:30pm–2:30pm.
    expect(rows.find((r) => r.to_address === PHONES.dee)!.body).toContain('between 12:30pm and 2:30pm');
    const stops = await knex('stops').whereIn('id', day.stopIds).orderBy('position');
    expect(stops[0].window_start_at.toISOString()).toBe(`${DATE}T12:30:00.000Z`);
  });

  it('re-publishing the same plan queues nothing new (idempotency key per visit and window)', async () => {
    const before = (await textsOfPlan()).length;
    const again = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(again).toMatchObject({ queued: 0, updates: 0, unchanged: 2 });
    expect((await textsOfPlan()).length).toBe(before);
  });

  it('sends the queued texts through the twilio SDK to the fake, and delivery reports mark them delivered', async () => {
    // Held until 08:00: a minute earlier nothing goes.
    const rows0 = await textsOfPlan();
    expect(rows0.map((r) => new Date(r.send_after).toISOString())).toEqual([MORNING.toISOString(), MORNING.toISOString()]);
    expect(await sendDueMessages(knex, new Date(MORNING.getTime() - 60_000), { planId: day.planId })).toMatchObject({ sent: 0 });
    const sent = await sendDueMessages(knex, MORNING, { planId: day.planId });
    expect(sent.sent).toBe(2);
    expect(await fakeTextsTo(PHONES.ada)).toHaveLength(1);
    expect(await fakeTextsTo(PHONES.dee)).toHaveLength(1);
    expect(await fakeTextsTo(PHONES.bea)).toHaveLength(0);
    expect(await fakeTextsTo(PHONES.cal)).toHaveLength(0);
    const rows = await eventually(textsOfPlan, (r) => r.every((m) => m.state === 'delivered'));
    expect(rows.map((r) => r.state)).toEqual(['delivered', 'delivered']);
    expect(rows[0].provider_id).toMatch(/^SM[0-9a-f]{32}$/);
  });

  it('a later change within the update threshold (30 min) sends nothing; beyond it one update text', async () => {
    // Move stop 1 by 20 minutes: 09:07 → 09:27 EDT rounds to 09:30, window 9:00–10:00: both ends move 30 min, not more.
    await knex('stops').where({ id: day.stopIds[0] }).update({ arrival_at: new Date(`${DATE}T13:27:00Z`) });
    const small = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(small).toMatchObject({ queued: 0, updates: 0 });
    // Move it to 10:10 EDT (14:10Z) → 10:15, window 9:45–10:45: 75 minutes from 8:30 → update.
    await knex('stops').where({ id: day.stopIds[0] }).update({ arrival_at: new Date(`${DATE}T14:10:00Z`) });
    const big = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(big).toMatchObject({ queued: 0, updates: 1 });
    const update = (await textsOfPlan()).pop();
    expect(update.to_address).toBe(PHONES.ada);
    expect(update.body).toContain('between 9:45am and 10:45am');
    expect(update.body).toContain('was 8:30am-9:30am');
    // Publishing that again changes nothing.
    const repeat = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(repeat.updates + repeat.queued).toBe(0);
  });

  it('holds a due text back when the sender runs inside quiet hours, until 08:00 on the practice clock', async () => {
    // The update was queued at 22:00 EDT → send_after 08:00 EDT. Pretend it had been due at 21:00 EDT
    // (01:00Z) and the sender runs at 23:00 EDT (03:00Z): it must wait, not go.
    const update = (await textsOfPlan()).pop();
    await knex('messages').where({ id: update.id }).update({ send_after: new Date(`${DATE}T01:00:00Z`) });
    const result = await sendDueMessages(knex, new Date(`${DATE}T03:00:00Z`), { planId: day.planId });
    expect(result).toMatchObject({ sent: 0, deferred: 1 });
    const held = await knex('messages').where({ id: update.id }).first();
    expect(held.state).toBe('queued');
    expect(new Date(held.send_after).toISOString()).toBe(MORNING.toISOString());
    expect(await sendDueMessages(knex, MORNING, { planId: day.planId })).toMatchObject({ sent: 1 });
    expect(await fakeTextsTo(PHONES.ada)).toHaveLength(2);
  });

  it('uses one key prefix per owner visit, so the keys of one visit are found together', async () => {
    const prefix = visitKeyPrefix(1, DATE, day.barnIds[0]!, day.ownerIds[0]!);
    const keys = (await knex('messages').where('idempotency_key', 'like', `${prefix}%`).select('idempotency_key')).map((r) => r.idempotency_key);
    expect(keys).toHaveLength(2);
    expect(new Set(keys).size).toBe(2);
  });
});

describe('replies by keyword through the signed webhook (CTIA keywords)', () => {
  const reply = async (from: string, body: string) => {
    const response = await fetch(`${process.env.FAKES_URL}/sms/inbound`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ from, body, url: `${APP_URL}/api/sms/inbound` }),
    });
    return (await response.json()) as { appStatus: number };
  };

  it('STOP opts the owner out with the time, confirms once, and drops queued texts', async () => {
    // A queued text for Dee waiting on quiet hours, to be dropped by the opt-out.
    await knex('stops').where({ id: day.stopIds[3] }).update({ arrival_at: new Date(`${DATE}T19:30:00Z`) });
    const queued = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(queued.updates).toBe(1);
    expect((await reply(PHONES.dee, 'Stop')).appStatus).toBe(200);
    const owner = await knex('owners').where({ id: day.ownerIds[3] }).first();
    expect(owner.opted_out_at).not.toBeNull();
    const confirmations = (await fakeTextsTo(PHONES.dee)).filter((m) => m.body.includes('no more texts'));
    expect(confirmations).toHaveLength(1);
    const dropped = (await textsOfPlan()).filter((m) => m.to_address === PHONES.dee && m.state === 'suppressed');
    expect(dropped).toHaveLength(1);
    // A second opt-out word gets no second confirmation (CTIA: one confirmation, nothing after).
    await reply(PHONES.dee, 'UNSUBSCRIBE');
    expect((await fakeTextsTo(PHONES.dee)).filter((m) => m.body.includes('no more texts'))).toHaveLength(1);
    // No text goes to an opted-out owner, whatever the plan does.
    await knex('stops').where({ id: day.stopIds[3] }).update({ arrival_at: new Date(`${DATE}T15:00:00Z`) });
    const after = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(after.queued + after.updates).toBe(0);
  });

  it('START opts back in and HELP answers with the practice contact', async () => {
    await reply(PHONES.dee, 'START');
    const owner = await knex('owners').where({ id: day.ownerIds[3] }).first();
    expect(owner.opted_out_at).toBeNull();
    await reply(PHONES.dee, 'help');
    const texts = await fakeTextsTo(PHONES.dee);
    expect(texts.some((m) => m.body.includes('arrival-time texts are back on'))).toBe(true);
    // The demo practice's contact number from the seed.
    expect(texts.some((m) => m.body.includes('+18595550142'))).toBe(true);
    const inbound = await knex('messages').where({ owner_id: day.ownerIds[3], direction: 'in' }).orderBy('id');
    expect(inbound.map((m) => m.body)).toEqual(['Stop', 'UNSUBSCRIBE', 'START', 'help']);
  });

  it('refuses a webhook call without a valid signature', async () => {
    const response = await fetch(`${APP_URL}/api/sms/inbound`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: APP_URL, 'x-twilio-signature': 'bm90IGEgc2lnbmF0dXJl' },
      body: new URLSearchParams({ From: PHONES.ada, Body: 'STOP' }).toString(),
    });
    expect(response.status).toBe(403);
    const owner = await knex('owners').where({ id: day.ownerIds[0] }).first();
    expect(owner.opted_out_at).toBeNull();
  });
});

describe('GET /api/messages', () => {
  it('lists the day texts with segments, encoding, state and stop for a dispatcher, and refuses a farrier', async () => {
    const answer = await call('GET', `/api/messages?date=${DATE}`, { cookie: await sessionCookie('dispatcher@demo.test') });
    expect(answer.status).toBe(200);
    const mine = answer.body.messages.filter((m: { to: string }) => m.to === PHONES.ada);
    expect(mine.length).toBeGreaterThanOrEqual(2);
    for (const m of mine) {
      expect(m).toMatchObject({ channel: 'sms', encoding: 'gsm7', stopId: day.stopIds[0] });
      expect(m.segments).toBe(countSegments(m.body).segments);
      expect(['queued', 'sent', 'delivered']).toContain(m.state);
    }
    expect((await call('GET', `/api/messages?date=${DATE}`, { cookie: await sessionCookie('farrier1@demo.test') })).status).toBe(403);
    expect((await call('GET', '/api/messages?date=2027-02-30', { cookie: await sessionCookie('dispatcher@demo.test') })).status).toBe(400);
  });

  it('keeps practices apart: the other practice sees none of these texts', async () => {
    const answer = await call('GET', `/api/messages?date=${DATE}`, { cookie: await sessionCookie('dispatcher@other.test') });
    expect(answer.body.messages.filter((m: { to: string }) => Object.values(PHONES).includes(m.to))).toHaveLength(0);
  });
});

describe('text templates', () => {
  it('previews a template with its segment count, and refuses to save one without an opt-out line', async () => {
    const cookie = await sessionCookie('lead@other.test');
    const preview = await call('POST', '/api/templates/preview', { cookie, body: { template: 'Hi {farrier} at {start}–{end}. Reply STOP to opt out.' } });
    expect(preview.status).toBe(200);
    // The en dash is outside GSM 03.38 → UCS-2 (3GPP TS 23.038).
    expect(preview.body.encoding).toBe('ucs2');
    const current = (await call('GET', '/api/templates', { cookie })).body.settings;
    const bad = await call('PUT', '/api/templates', { cookie, body: { ...current, arrivalTemplate: 'See you between {start} and {end}!' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.arrivalTemplate).toMatch(/opt out/);
    const good = await call('PUT', '/api/templates', { cookie, body: { ...current, updateThresholdMinutes: 45 } });
    expect(good.status).toBe(200);
    expect(good.body.settings.updateThresholdMinutes).toBe(45);
    expect(good.body.preview.arrival.segments).toBe(countSegments(good.body.preview.arrival.body).segments);
    // A dispatcher reads but may not save.
    expect((await call('PUT', '/api/templates', { cookie: await sessionCookie('dispatcher@other.test'), body: current })).status).toBe(403);
  });
});

describe('an owner whose horses at one barn are visited twice that day', () => {
  it('gets a text for each visit: the second does not replace the first', async () => {
    // A second stop at Ada's barn late in the day (the barn's horses split between two visits), with
    // a third horse of hers.
    const stopsBefore = await knex('stops').where({ route_id: day.routeId }).count({ n: '*' });
    const arrival = new Date(`${DATE}T20:07:00Z`);
    const [stopId] = await knex('stops').insert({
      practice_id: 1, route_id: day.routeId, position: Number(stopsBefore[0]!.n) + 1, barn_id: day.barnIds[0],
      arrival_at: arrival, start_at: new Date(arrival.getTime() + 10 * 60_000), departure_at: new Date(arrival.getTime() + 70 * 60_000),
      leg_drive_seconds: 20 * 60, leg_distance_m: 14_000,
    });
    const [horseId] = await knex('horses').insert({ practice_id: 1, owner_id: day.ownerIds[0], barn_id: day.barnIds[0], name: 'Juniper', cycle_weeks: 6 });
    const [jobId] = await knex('jobs').insert({ practice_id: 1, horse_id: horseId, minutes: 45, due_on: DATE, state: 'booked' });
    await knex('stop_jobs').insert({ stop_id: stopId, job_id: jobId, plan_id: day.planId, position: 0 });

    const firstVisit = visitKeyPrefix(1, DATE, day.barnIds[0]!, day.ownerIds[0]!);
    const secondVisit = visitKeyPrefix(1, DATE, day.barnIds[0]!, day.ownerIds[0]!, 2);
    expect(secondVisit).not.toBe(firstVisit);
    const before = await knex('messages').where('idempotency_key', 'like', `${firstVisit}%`).orderBy('id').select('id', 'state');
    const result = await knex.transaction((trx) => queueArrivalTexts(trx, { practiceId: 1, planId: day.planId, userId: null }, QUEUE_NOW));
    expect(result.queued).toBe(1);
    const second = await knex('messages').where('idempotency_key', 'like', `${secondVisit}%`).select('state', 'body', 'stop_id');
    expect(second).toHaveLength(1);
    expect(second[0]).toMatchObject({ state: 'queued', stop_id: Number(stopId) });
    // Planned 20:07Z = 16:07 EDT → 16:00; the fifth stop of the day: 60 + 4 × 15 = 120 minutes.
    expect(second[0].body).toContain('between 3:00pm and 5:00pm');
    expect(second[0].body).toContain('Juniper');
    expect(second[0].body).not.toContain('Marigold');
    // The first visit's texts are as they were: none replaced, none added.
    const after = await knex('messages').where('idempotency_key', 'like', `${firstVisit}%`).whereNot('idempotency_key', 'like', `${secondVisit}%`).orderBy('id').select('id', 'state');
    expect(after).toEqual(before);
  });
});
