// Records through the running app on the real MariaDB: forms' good and bad input, delete refusal,
// paging and search, practice isolation, due list and job creation, CSV import, uploads.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { APP_URL, call, sessionCookie } from '../helpers/api.ts';
import { appDatabase } from '../helpers/db.ts';

const tag = `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const db = appDatabase();
let dispatcher = '';
let other = '';
let farrier = '';
let practice1 = { ownerId: 0, barnId: 0, workTypeId: 0 };

beforeAll(async () => {
  dispatcher = await sessionCookie('dispatcher@demo.test');
  other = await sessionCookie('dispatcher@other.test');
  farrier = await sessionCookie('farrier1@demo.test');
  const owner = await db('owners').where({ practice_id: 1 }).whereNull('archived_at').first('id');
  const barn = await db('barns').where({ practice_id: 1 }).whereNull('archived_at').first('id');
  const wt = await db('work_types').where({ practice_id: 1, name: 'Trim' }).first('id');
  practice1 = { ownerId: owner.id, barnId: barn.id, workTypeId: wt.id };
});
afterAll(async () => {
  await db.destroy();
});

const hours = [[[420, 1140]], [[420, 1140]], [[420, 1140]], [[420, 1140]], [[420, 1140]], [], []];

describe('forms: good input is stored, bad input is a 400 naming the field', () => {
  it('an owner phone typed as (859) 555-0192 is stored as E.164; an undiallable one names the phone field', async () => {
    const good = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: `Ottoline Varne ${tag}`, phone: '(859) 555-0192', textConsent: true } });
    expect(good.status).toBe(201);
    expect(good.body.owner.phone).toBe('+18595550192');
    expect(good.body.owner.textConsentAt).not.toBeNull();
    const bad = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: `Bad Phone ${tag}`, phone: '555-01' } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['phone']);
    const noName = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: '  ' } });
    expect(noName.status).toBe(400);
    expect(noName.body.error.fields.name).toBeDefined();
  });

  it('a barn needs its pin and seven days of hours; closing before opening names that day', async () => {
    const good = await call('POST', '/api/barns', { cookie: dispatcher, body: { name: `Fernlea Barn ${tag}`, address: '3 Fernlea Lane', lat: 38.21, lon: -84.61, accessHours: hours, setupMinutes: 12 } });
    expect(good.status).toBe(201);
    expect(good.body.barn).toMatchObject({ lat: 38.21, lon: -84.61, setupMinutes: 12, accessHours: hours });
    const noPin = await call('POST', '/api/barns', { cookie: dispatcher, body: { name: `No Pin ${tag}`, address: '4 Fernlea Lane', accessHours: hours } });
    expect(noPin.status).toBe(400);
    expect(noPin.body.error.fields).toHaveProperty('lat');
    const backwards = await call('POST', '/api/barns', { cookie: dispatcher, body: { name: `Backwards ${tag}`, address: '5 Fernlea Lane', lat: 38.2, lon: -84.6, accessHours: [[[1000, 400]], [], [], [], [], [], []] } });
    expect(backwards.status).toBe(400);
    expect(Object.keys(backwards.body.error.fields)[0]).toMatch(/^accessHours\.0/);
    const sixDays = await call('POST', '/api/barns', { cookie: dispatcher, body: { name: `Six ${tag}`, address: '6 Fernlea Lane', lat: 38.2, lon: -84.6, accessHours: hours.slice(0, 6) } });
    expect(sixDays.status).toBe(400);
    expect(sixDays.body.error.fields).toHaveProperty('accessHours');
  });

  it('a horse must name an owner, barn and work type of the same practice', async () => {
    const good = await call('POST', '/api/horses', { cookie: dispatcher, body: { name: `Marram ${tag}`, ownerId: practice1.ownerId, barnId: practice1.barnId, cycleWeeks: 6, lastVisitOn: '2026-10-18', workTypeIds: [practice1.workTypeId] } });
    expect(good.status).toBe(201);
    // The database's generated next_due_on agrees with calendar arithmetic: 18 Oct + 42 days = 29 Nov.
    expect(good.body.horse.nextDueOn).toBe('2026-11-29');
    const otherBarn = await db('barns').where({ practice_id: 2 }).first('id');
    const crossed = await call('POST', '/api/horses', { cookie: dispatcher, body: { name: `Crossed ${tag}`, ownerId: practice1.ownerId, barnId: otherBarn.id, cycleWeeks: 6, workTypeIds: [practice1.workTypeId] } });
    expect(crossed.status).toBe(400);
    expect(Object.keys(crossed.body.error.fields)).toEqual(['barnId']);
    const noWork = await call('POST', '/api/horses', { cookie: dispatcher, body: { name: `No work ${tag}`, ownerId: practice1.ownerId, barnId: practice1.barnId, cycleWeeks: 6, workTypeIds: [] } });
    expect(noWork.status).toBe(400);
    expect(noWork.body.error.fields).toHaveProperty('workTypeIds');
    const badDate = await call('POST', '/api/horses', { cookie: dispatcher, body: { name: `Bad date ${tag}`, ownerId: practice1.ownerId, barnId: practice1.barnId, cycleWeeks: 6, lastVisitOn: '2026-02-30', workTypeIds: [practice1.workTypeId] } });
    expect(badDate.status).toBe(400);
    expect(badDate.body.error.fields).toHaveProperty('lastVisitOn');
  });

  it('a work type needs whole minutes; a duplicate name is a 409', async () => {
    const good = await call('POST', '/api/work-types', { cookie: dispatcher, body: { name: `Wedge pads ${tag}`, minutesPerHorse: 20, priceCents: 4000 } });
    expect(good.status).toBe(201);
    const dup = await call('POST', '/api/work-types', { cookie: dispatcher, body: { name: `Wedge pads ${tag}`, minutesPerHorse: 20 } });
    expect(dup.status).toBe(409);
    const bad = await call('POST', '/api/work-types', { cookie: dispatcher, body: { name: `Half ${tag}`, minutesPerHorse: 12.5 } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['minutesPerHorse']);
  });

  it('a farrier is written by the lead only; an apprentice cannot be marked qualified', async () => {
    const lead = await sessionCookie('lead@demo.test');
    const body = { name: `Corin Ashdown ${tag}`, homeAddress: '12 Mill Lane', homeLat: 38.19, homeLon: -84.58, workingDays: [1, 2, 3], shiftStartMinute: 450, shiftEndMinute: 1020 };
    expect((await call('POST', '/api/farriers', { cookie: dispatcher, body })).status).toBe(403);
    const good = await call('POST', '/api/farriers', { cookie: lead, body });
    expect(good.status).toBe(201);
    expect(good.body.farrier.workingDays).toEqual([1, 2, 3]);
    const bad = await call('POST', '/api/farriers', { cookie: lead, body: { ...body, apprentice: true, qualifiedTherapeutic: true } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('qualifiedTherapeutic');
    const backwards = await call('PATCH', `/api/farriers/${good.body.farrier.id}`, { cookie: lead, body: { shiftEndMinute: 400 } });
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.fields).toHaveProperty('shiftEndMinute');
  });

  it('a PATCH with nothing to change is a 400, and every change writes an audit row', async () => {
    const created = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: `Audit Me ${tag}` } });
    const id = created.body.owner.id;
    expect((await call('PATCH', `/api/owners/${id}`, { cookie: dispatcher, body: {} })).status).toBe(400);
    expect((await call('PATCH', `/api/owners/${id}`, { cookie: dispatcher, body: { notes: 'Prefers mornings' } })).status).toBe(200);
    const rows = await db('audit_log').where({ entity: 'owner', entity_id: id }).orderBy('id').pluck('action');
    expect(rows).toEqual(['owner.create', 'owner.update']);
  });
});

describe('deleting and archiving', () => {
  it('refuses to delete an owner with horses, saying why, and archives instead', async () => {
    const used = await db('horses').where({ practice_id: 1 }).first('owner_id');
    const refused = await call('DELETE', `/api/owners/${used.owner_id}`, { cookie: dispatcher });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/still has \d+ horses?/);
    expect(await db('owners').where({ id: used.owner_id }).first('id')).toBeDefined();
  });

  it('refuses to delete a work type horses get and a barn with visits', async () => {
    expect((await call('DELETE', `/api/work-types/${practice1.workTypeId}`, { cookie: dispatcher })).status).toBe(409);
    const visited = await db('visit_logs').where({ practice_id: 1 }).first('barn_id');
    const r = await call('DELETE', `/api/barns/${visited.barn_id}`, { cookie: dispatcher });
    expect(r.status).toBe(409);
    expect(r.body.error.message).toMatch(/recorded visit/);
  });

  it('refuses to delete a horse with recorded visits and a farrier with a linked account, and keeps both', async () => {
    const visited = await db('visit_log_horses').join('horses', 'horses.id', 'visit_log_horses.horse_id').where('horses.practice_id', 1).first('horse_id');
    const horse = await call('DELETE', `/api/horses/${visited.horse_id}`, { cookie: dispatcher });
    expect(horse.status).toBe(409);
    expect(horse.body.error.message).toMatch(/recorded visit/);
    expect(await db('horses').where({ id: visited.horse_id }).first('id')).toBeDefined();
    const linked = await db('users').where({ practice_id: 1 }).whereNotNull('farrier_id').first('farrier_id');
    const lead = await sessionCookie('lead@demo.test');
    const farrier = await call('DELETE', `/api/farriers/${linked.farrier_id}`, { cookie: lead });
    expect(farrier.status).toBe(409);
    expect(await db('farriers').where({ id: linked.farrier_id }).first('id')).toBeDefined();
  });

  it('deletes an unused owner, and archiving hides one from the list but keeps it', async () => {
    const a = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: `Unused ${tag}` } });
    expect((await call('DELETE', `/api/owners/${a.body.owner.id}`, { cookie: dispatcher })).status).toBe(200);
    expect(await db('owners').where({ id: a.body.owner.id }).first('id')).toBeUndefined();
    const b = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: `Archived ${tag}` } });
    expect((await call('PATCH', `/api/owners/${b.body.owner.id}`, { cookie: dispatcher, body: { archived: true } })).status).toBe(200);
    const current = await call('GET', `/api/owners?q=${encodeURIComponent(`Archived ${tag}`)}`, { cookie: dispatcher });
    expect(current.body.total).toBe(0);
    const archived = await call('GET', `/api/owners?archived=only&q=${encodeURIComponent(`Archived ${tag}`)}`, { cookie: dispatcher });
    expect(archived.body.items.map((o: { id: number }) => o.id)).toEqual([b.body.owner.id]);
  });
});

describe('paging, sorting and search run on the server', () => {
  it('pages of horses do not overlap and the total counts every match', async () => {
    const total = await db('horses').where({ practice_id: 1 }).whereNull('archived_at').count({ n: '*' });
    const p1 = await call('GET', '/api/horses?pageSize=10&page=1&sort=name', { cookie: dispatcher });
    const p2 = await call('GET', '/api/horses?pageSize=10&page=2&sort=name', { cookie: dispatcher });
    expect(p1.status).toBe(200);
    expect(p1.body.total).toBe(Number(total[0]!.n));
    expect(p1.body.items).toHaveLength(10);
    const ids1 = new Set(p1.body.items.map((h: { id: number }) => h.id));
    expect(p2.body.items.some((h: { id: number }) => ids1.has(h.id))).toBe(false);
    const names = p1.body.items.map((h: { name: string }) => h.name);
    expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b, 'en', { sensitivity: 'base' })));
  });

  it('search matches horse, owner or barn names; a page size above 100 is refused', async () => {
    const r = await call('GET', `/api/horses?q=${encodeURIComponent(`Marram ${tag}`)}`, { cookie: dispatcher });
    expect(r.body.items.map((h: { name: string }) => h.name)).toEqual([`Marram ${tag}`]);
    expect((await call('GET', '/api/horses?pageSize=1000', { cookie: dispatcher })).status).toBe(400);
    expect((await call('GET', '/api/horses?sort=password', { cookie: dispatcher })).status).toBe(400);
  });

  it('farriers may read horses and barns but not write them', async () => {
    expect((await call('GET', '/api/horses?pageSize=5', { cookie: farrier })).status).toBe(200);
    expect((await call('POST', '/api/barns', { cookie: farrier, body: {} })).status).toBe(403);
  });
});

describe('practice isolation', () => {
  it("another practice's records are 404 and never appear in its lists or searches", async () => {
    const mine = await call('POST', '/api/owners', { cookie: dispatcher, body: { name: `Hidden Owner ${tag}` } });
    const id = mine.body.owner.id;
    expect((await call('GET', `/api/owners/${id}`, { cookie: other })).status).toBe(404);
    expect((await call('PATCH', `/api/owners/${id}`, { cookie: other, body: { name: 'Taken' } })).status).toBe(404);
    expect((await call('DELETE', `/api/owners/${id}`, { cookie: other })).status).toBe(404);
    const search = await call('GET', `/api/owners?q=${encodeURIComponent(`Hidden Owner ${tag}`)}`, { cookie: other });
    expect(search.body.total).toBe(0);
    const horse = await db('horses').where({ practice_id: 1 }).first('id', 'name');
    expect((await call('GET', `/api/horses/${horse.id}`, { cookie: other })).status).toBe(404);
    const horses = await call('GET', '/api/horses?pageSize=100', { cookie: other });
    const practice2 = await db('horses').where({ practice_id: 2 }).whereNull('archived_at').pluck('id');
    for (const h of horses.body.items) expect(practice2).toContain(h.id);
    const due = await call('GET', '/api/jobs/due?pageSize=100', { cookie: other });
    for (const h of due.body.items) expect(practice2).toContain(h.horseId);
  });
});

describe('the due list and job creation', () => {
  it('creates jobs for a date range once: a horse never gets a second open job', async () => {
    const barn = await call('POST', '/api/barns', { cookie: dispatcher, body: { name: `Jobs Barn ${tag}`, address: '8 Reed Row', lat: 38.22, lon: -84.62, accessHours: hours } });
    const barnId = barn.body.barn.id;
    for (const [name, last] of [['Alder', '2026-01-05'], ['Birch', '2026-01-12']]) {
      const r = await call('POST', '/api/horses', { cookie: dispatcher, body: { name: `${name} ${tag}`, ownerId: practice1.ownerId, barnId, cycleWeeks: 6, lastVisitOn: last, workTypeIds: [practice1.workTypeId] } });
      expect(r.status).toBe(201);
    }
    // Due 16 Feb and 23 Feb 2026 (5 Jan + 42 days; 12 Jan + 42 days).
    const first = await call('POST', '/api/jobs/batch', { cookie: dispatcher, body: { from: '2026-02-16', to: '2026-02-23', includeOverdue: false, barnId } });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ created: 2, alreadyOpen: 0 });
    const jobs = await db('jobs').whereIn('id', first.body.jobIds).orderBy('due_on').select('due_on', 'minutes', 'state');
    const trim = await db('work_types').where({ id: practice1.workTypeId }).first('minutes_per_horse');
    expect(jobs.map((j) => [String(j.due_on).slice(0, 10), j.minutes, j.state])).toEqual([['2026-02-16', trim.minutes_per_horse, 'due'], ['2026-02-23', trim.minutes_per_horse, 'due']]);
    const again = await call('POST', '/api/jobs/batch', { cookie: dispatcher, body: { from: '2026-02-16', to: '2026-02-23', includeOverdue: false, barnId } });
    expect(again.body).toMatchObject({ created: 0, alreadyOpen: 2 });
    const horse = await db('horses').where({ barn_id: barnId }).first('id');
    const single = await call('POST', '/api/jobs', { cookie: dispatcher, body: { horseId: horse.id } });
    expect(single.status).toBe(409);
    expect(single.body.error.message).toMatch(/already has an open job/);
    const due = await call('GET', `/api/jobs/due?barnId=${barnId}`, { cookie: dispatcher });
    expect(due.body.items.every((h: { openJob: unknown; bucket: string }) => h.openJob !== null && h.bucket === 'overdue')).toBe(true);
    expect(due.body.counts.overdue).toBe(2);
    const cancelled = await call('POST', `/api/jobs/${first.body.jobIds[0]}/cancel`, { cookie: dispatcher, body: { reason: 'Horse sold' } });
    expect(cancelled.status).toBe(200);
    // A cancelled job is no longer due, so a second cancel is refused and names its state.
    const twice = await call('POST', `/api/jobs/${first.body.jobIds[0]}/cancel`, { cookie: dispatcher, body: { reason: 'Again' } });
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toMatch(/cancelled/);
    expect((await call('POST', '/api/jobs', { cookie: dispatcher, body: { horseId: horse.id } })).status).toBe(201);
  });

  it('a reversed or too long date range names the "to" field', async () => {
    const r = await call('POST', '/api/jobs/batch', { cookie: dispatcher, body: { from: '2026-03-10', to: '2026-03-01' } });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty('to');
  });
});

function csvOf(rows: string[]): string {
  return ['Owner name,Owner phone,Barn name,Barn address,Barn latitude,Barn longitude,Horse name,Cycle weeks,Last visit,Usual work', ...rows].join('\n');
}
const MAPPING = { ownerName: 'Owner name', ownerPhone: 'Owner phone', barnName: 'Barn name', barnAddress: 'Barn address', barnLat: 'Barn latitude', barnLon: 'Barn longitude', horseName: 'Horse name', cycleWeeks: 'Cycle weeks', lastVisitOn: 'Last visit', work: 'Usual work' };

describe('CSV import', () => {
  const counts = async () => Promise.all(['owners', 'barns', 'horses'].map(async (t) => Number((await db(t).where({ practice_id: 1 }).count({ n: '*' }))[0]!.n)));

  it('a file with a bad row changes nothing, and the preview lists the row and why', async () => {
    const csv = csvOf([
      `Rhoswen Tarrant ${tag},(859) 555-0193,Import Barn ${tag},"7 Sloe Lane, Merrowdale",38.23,-84.57,Hobnob ${tag},6,2026-10-01,Trim`,
      `Rhoswen Tarrant ${tag},not a phone,Import Barn ${tag},"7 Sloe Lane, Merrowdale",38.23,-84.57,Pennant ${tag},6,2026-10-01,Trim`,
    ]);
    const before = await counts();
    const preview = await call('POST', '/api/import/preview', { cookie: dispatcher, body: { csv, mapping: MAPPING } });
    expect(preview.status).toBe(200);
    expect(preview.body.badRows).toEqual([{ line: 3, reasons: ['Phone "not a phone" cannot be turned into an E.164 number'] }]);
    const commit = await call('POST', '/api/import/commit', { cookie: dispatcher, body: { csv, mapping: MAPPING } });
    expect(commit.status).toBe(400);
    expect(await counts()).toEqual(before);
  });

  it('importing the same file twice creates no duplicates', async () => {
    const csv = csvOf([
      `Elowen Marsh ${tag},(502) 555-0194,Import Barn ${tag},"7 Sloe Lane, Merrowdale",38.23,-84.57,Hobnob ${tag},6,2026-10-01,Trim`,
      `Elowen Marsh ${tag},(502) 555-0194,Import Barn ${tag},"7 Sloe Lane, Merrowdale",38.23,-84.57,Pennant ${tag},5,10/15/2026,Trim`,
    ]);
    const before = await counts();
    const first = await call('POST', '/api/import/commit', { cookie: dispatcher, body: { csv, mapping: MAPPING } });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ owners: 1, barns: 1, horses: 2, unchanged: 0 });
    const after = await counts();
    expect(after).toEqual([before[0]! + 1, before[1]! + 1, before[2]! + 2]);
    const second = await call('POST', '/api/import/commit', { cookie: dispatcher, body: { csv, mapping: MAPPING } });
    expect(second.status).toBe(201);
    expect(second.body).toMatchObject({ owners: 0, barns: 0, horses: 0, unchanged: 2 });
    expect(await counts()).toEqual(after);
    const owner = await db('owners').where({ practice_id: 1, name: `Elowen Marsh ${tag}` }).first('phone');
    expect(owner.phone).toBe('+15025550194');
  });

  it('a missing required column mapping names the field', async () => {
    const r = await call('POST', '/api/import/preview', { cookie: dispatcher, body: { csv: csvOf([]), mapping: { ownerName: 'Owner name' } } });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty('mapping.horseName');
  });
});

async function upload(horseId: number, bytes: Uint8Array, name: string, cookie = dispatcher) {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(bytes)]), name);
  form.set('kind', 'photo');
  const response = await fetch(`${APP_URL}/api/horses/${horseId}/uploads`, { method: 'POST', body: form, headers: { cookie, origin: APP_URL } });
  return { status: response.status, body: await response.json().catch(() => null) };
}

describe('uploads', () => {
  let horseId = 0;
  beforeAll(async () => {
    horseId = (await db('horses').where({ practice_id: 1 }).whereNull('archived_at').first('id')).id;
  });

  it('stores a PNG, makes a thumbnail, and serves both only to signed-in users of the same practice', async () => {
    const png = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#c39035' } }).png().toBuffer();
    const r = await upload(horseId, png, `hoof-${tag}.png`);
    expect(r.status).toBe(201);
    expect(r.body.upload).toMatchObject({ mimeType: 'image/png', hasThumb: true, sizeBytes: png.length });
    const id = r.body.upload.id;
    const full = await fetch(`${APP_URL}/api/uploads/${id}`, { headers: { cookie: farrier } });
    expect(full.status).toBe(200);
    expect(full.headers.get('content-type')).toBe('image/png');
    expect(Buffer.from(await full.arrayBuffer()).equals(png)).toBe(true);
    const thumb = await fetch(`${APP_URL}/api/uploads/${id}?size=thumb`, { headers: { cookie: dispatcher } });
    const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata();
    // 640 × 480 fitted inside 320 × 320 keeps the 4:3 shape: 320 × 240.
    expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 320, 240]);
    expect((await fetch(`${APP_URL}/api/uploads/${id}`)).status).toBe(401);
    expect((await fetch(`${APP_URL}/api/uploads/${id}`, { headers: { cookie: other } })).status).toBe(404);
  });

  it('refuses a renamed executable (415) whatever its name says', async () => {
    // "MZ" is the DOS/PE executable signature; the rest is filler.
    const exe = new Uint8Array(4096);
    exe.set([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0x04, 0x00]);
    const r = await upload(horseId, exe, `radiograph-${tag}.jpg`);
    expect(r.status).toBe(415);
    expect(r.body.error.code).toBe('unsupported_media_type');
  });

  it('refuses a file one byte over 15 MB (413)', async () => {
    // 15 × 1024 × 1024 + 1 = 15,728,641 bytes, starting with a JPEG signature.
    const big = new Uint8Array(15 * 1024 * 1024 + 1);
    big.set([0xff, 0xd8, 0xff, 0xe0]);
    const r = await upload(horseId, big, `big-${tag}.jpg`);
    expect(r.status).toBe(413);
    const count = await db('uploads').where({ file_name: `big-${tag}.jpg` }).count({ n: '*' });
    expect(Number(count[0]!.n)).toBe(0);
  });

  it("another practice cannot upload to this practice's horse", async () => {
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } }).png().toBuffer();
    expect((await upload(horseId, png, 'x.png', other)).status).toBe(404);
  });
});
