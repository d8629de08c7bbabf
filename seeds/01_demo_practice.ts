// The fictional demo: a farrier practice in the invented Wrenmoor County (address points from
// tiles/source/addresses.geojson) and a second, small practice that exists to prove isolation.
// Generated from a fixed seed, relative to "today" in the practice's time zone (SEED_TODAY=YYYY-MM-DD
// fixes it), so every load with the same day is identical. Reset-then-insert: demo and test only.
import type { Knex } from 'knex';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';
import { hash } from '@node-rs/argon2';
import { Random } from '../src/lib/random.ts';
import { haversineM } from '../src/lib/geo.ts';

export const DEMO_PASSWORD = 'roundsmith-demo';
const TZ = 'America/New_York';
const SEED = 20261201;


interface AddressPoint {
  id: string;
  lat: number;
  lon: number;
  housenumber: string;
  street: string;
  village: string;
  kind: 'farm' | 'house';
}

function loadAddresses(): AddressPoint[] {
  const file = path.resolve('tiles/source/addresses.geojson');
  const data = JSON.parse(readFileSync(file, 'utf8')) as {
    features: { geometry: { coordinates: [number, number] }; properties: Omit<AddressPoint, 'lat' | 'lon'> }[];
  };
  return data.features.map((f) => ({ ...f.properties, lon: f.geometry.coordinates[0], lat: f.geometry.coordinates[1] }));
}

const addressText = (a: AddressPoint) => `${a.housenumber} ${a.street}, ${a.village}`;

/** Calendar arithmetic on 'YYYY-MM-DD' strings, independent of the server's own time zone. */
function addDays(iso: string, days: number): string {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}
/** ISO weekday, 1 = Monday … 7 = Sunday. */
function isoWeekday(iso: string): number {
  const day = new Date(`${iso}T00:00:00Z`).getUTCDay();
  return day === 0 ? 7 : day;
}
/** The instant of a local wall-clock time on a day, in the practice's zone. */
function at(iso: string, minuteOfDay: number): Date {
  const total = Math.round(minuteOfDay * 60);
  if (total >= 86_400) return at(addDays(iso, 1), (total - 86_400) / 60);
  const two = (n: number) => String(n).padStart(2, '0');
  return fromZonedTime(`${iso}T${two(Math.floor(total / 3600))}:${two(Math.floor((total % 3600) / 60))}:${two(total % 60)}`, TZ);
}

// Invented name parts. Combinations are random; none is meant to name a real person or place.
const FIRST = ['Ada', 'Bram', 'Cora', 'Dell', 'Edie', 'Finn', 'Gwen', 'Hal', 'Iris', 'Jude', 'Kit', 'Lark', 'Mae', 'Ned', 'Opal', 'Pip', 'Quin', 'Rue', 'Sid', 'Tess', 'Ula', 'Vic', 'Wren', 'Yara', 'Zeke', 'Bea', 'Cal', 'Dot', 'Ezra', 'Fay', 'Gus', 'Hettie', 'Ivo', 'Joss', 'Lou', 'Milo', 'Noor', 'Orla', 'Perry', 'Rosa'];
const LAST = ['Ashgrove', 'Brindlecombe', 'Coldharbour', 'Dunmarsh', 'Eavesby', 'Fallowfield', 'Greywether', 'Hollins', 'Inchbald', 'Juniperhill', 'Kettleby', 'Larkspur', 'Mossop', 'Nettlebed', 'Oakhanger', 'Pennick', 'Quarrendon', 'Rushmere', 'Saltonstall', 'Thistlewood', 'Underhay', 'Varley', 'Wickenden', 'Yarrowby', 'Brackett', 'Cropper', 'Dimmock', 'Fenwright', 'Gorringe', 'Hazeldene'];
const BARN_A = ['Willow', 'Foxglove', 'Hawthorn', 'Cobble', 'Meadowlark', 'Tanager', 'Clover', 'Birchwood', 'Stonewall', 'Red Gate', 'Maple Run', 'Sorrel', 'Buckthorn', 'Larch', 'Quarry', 'Millrace', 'Owlbrook', 'Heron', 'Briar', 'Pinecrest', 'Oxbow', 'Ridgeback', 'Tallgrass', 'Cedar Hollow'];
const BARN_B = ['Farm', 'Stables', 'Barn', 'Acres', 'Paddocks', 'Equestrian Center', 'Homestead', 'Ranch'];
const HORSE = ['Biscuit', 'Juniper', 'Maverick', 'Pepper', 'Clementine', 'Dusty', 'Whisper', 'Sundance', 'Marigold', 'Banjo', 'Hazel', 'Ranger', 'Tinker', 'Willow', 'Comet', 'Nutmeg', 'Rosie', 'Shadow', 'Toffee', 'Apollo', 'Bramble', 'Cricket', 'Duchess', 'Ember', 'Fable', 'Gatsby', 'Honey', 'Indigo', 'Jasper', 'Kestrel', 'Lucky', 'Mocha', 'Nova', 'Oakley', 'Paisley', 'Quincy', 'Rusty', 'Saffron', 'Thistle', 'Umber', 'Velvet', 'Wagner', 'Yukon', 'Ziggy', 'Acorn', 'Blue', 'Cinder', 'Dandelion', 'Echo', 'Fig'];
const HORSE_SUFFIX = ['', '', '', ' II', ' Star', ' Belle', ' Jack', ' Moon'];

interface WorkTypeSpec { name: string; minutes: number; forge: boolean; qualified: boolean; priceCents: number }
const WORK_TYPES: WorkTypeSpec[] = [
  // Minutes and prices are invented defaults within common practice; no source.
  { name: 'Trim', minutes: 30, forge: false, qualified: false, priceCents: 5500 },
  { name: 'Front shoes', minutes: 50, forge: false, qualified: false, priceCents: 12000 },
  { name: 'Full set', minutes: 75, forge: false, qualified: false, priceCents: 18000 },
  { name: 'Reset', minutes: 60, forge: false, qualified: false, priceCents: 15000 },
  { name: 'Hot fit', minutes: 15, forge: true, qualified: false, priceCents: 2500 },
  { name: 'Pads and packing', minutes: 15, forge: false, qualified: false, priceCents: 3500 },
  { name: 'Bar shoes', minutes: 90, forge: true, qualified: true, priceCents: 26000 },
  { name: 'Glue-on', minutes: 90, forge: false, qualified: true, priceCents: 24000 },
  { name: 'Therapeutic', minutes: 120, forge: true, qualified: true, priceCents: 30000 },
];

// loadMinutes: how much work (with an allowance for driving) the history gives the farrier a day at most;
// the two qualified farriers carry long six-day weeks, so the review has overtime to show.
interface FarrierSpec { name: string; qualified: boolean; apprentice: boolean; forge: boolean; days: number[]; colour: string; costCents: number; loadMinutes?: number }
const DEMO_FARRIERS: FarrierSpec[] = [
  { name: 'Tamsin Hollowell', qualified: true, apprentice: false, forge: true, days: [1, 2, 3, 4, 5, 6], colour: '#c2410c', costCents: 4800, loadMinutes: 570 },
  { name: 'Rory Pellingham', qualified: true, apprentice: false, forge: true, days: [1, 2, 3, 4, 5, 6], colour: '#1d4ed8', costCents: 4200, loadMinutes: 540 },
  { name: 'Idris Calloway', qualified: false, apprentice: false, forge: true, days: [1, 2, 3, 4, 5], colour: '#15803d', costCents: 3800 },
  { name: 'Maren Oakridge', qualified: false, apprentice: false, forge: true, days: [2, 3, 4, 5, 6], colour: '#7e22ce', costCents: 3800 },
  { name: 'Jory Whitlam', qualified: false, apprentice: false, forge: true, days: [1, 2, 3, 4, 5], colour: '#db2777', costCents: 3600 },
  { name: 'Wes Tindall', qualified: false, apprentice: true, forge: false, days: [1, 2, 3, 4], colour: '#ca8a04', costCents: 2400 },
];

interface Rows { [table: string]: Record<string, unknown>[] }

/** Builds every row of both practices in memory, then inserts them table by table. */
export async function seed(knex: Knex): Promise<void> {
  const today = process.env.SEED_TODAY ?? formatInTimeZone(new Date(), TZ, 'yyyy-MM-dd');
  const rng = new Random(SEED);
  const addresses = loadAddresses();
  const farms = rng.shuffle(addresses.filter((a) => a.kind === 'farm'));
  const houses = rng.shuffle(addresses.filter((a) => a.kind === 'house'));
  if (farms.length < 90 || houses.length < 10) throw new Error('addresses.geojson has too few address points');
  const passwordHash = await hash(DEMO_PASSWORD, { memoryCost: 19456, timeCost: 2, parallelism: 1 });
  const rows: Rows = {};
  const push = (table: string, row: Record<string, unknown>) => (rows[table] ??= []).push(row);
  const ids: Record<string, number> = {};
  const nextId = (table: string) => (ids[table] = (ids[table] ?? 0) + 1);

  // Practices.
  push('practices', {
    id: 1, name: 'Wrenmoor Hoof & Forge (fictional demo)', time_zone: TZ, units: 'miles', mileage_rate: 0.7,
    week_start: 1, planning_horizon_days: 7, contact_phone: '+18595550142', contact_email: 'office@wrenmoor-hoof.test',
  });
  push('practices', {
    id: 2, name: 'Pellwick Farrier Collective (fictional demo)', time_zone: TZ, units: 'miles', mileage_rate: 0.67,
    week_start: 0, planning_horizon_days: 5, contact_phone: '+15025550177', contact_email: 'desk@pellwick.test',
  });

  // Work types, per practice.
  const workTypeIds: Record<number, Record<string, number>> = { 1: {}, 2: {} };
  for (const practiceId of [1, 2]) {
    for (const w of WORK_TYPES) {
      const id = nextId('work_types');
      workTypeIds[practiceId]![w.name] = id;
      push('work_types', { id, practice_id: practiceId, name: w.name, minutes_per_horse: w.minutes, needs_forge: w.forge, needs_qualified: w.qualified, price_cents: practiceId === 1 ? w.priceCents : Math.round(w.priceCents * 0.95) });
    }
  }
  const workByName = Object.fromEntries(WORK_TYPES.map((w) => [w.name, w]));

  // Farriers and their homes.
  interface Farrier { id: number; practiceId: number; spec: FarrierSpec; home: AddressPoint }
  const farriers: Farrier[] = [];
  const addFarrier = (practiceId: number, spec: FarrierSpec, home: AddressPoint) => {
    const id = nextId('farriers');
    farriers.push({ id, practiceId, spec, home });
    push('farriers', {
      id, practice_id: practiceId, name: spec.name, phone: `+1859555${String(150 + id).padStart(4, '0')}`,
      home_address: addressText(home), home_lat: home.lat, home_lon: home.lon, qualified_therapeutic: spec.qualified,
      apprentice: spec.apprentice, has_forge: spec.forge, working_days: spec.days.join(','), shift_start_minute: 450,
      shift_end_minute: 1050, break_minutes: 30, break_window_start_minute: 690, break_window_end_minute: 840,
      normal_work_minutes: 480, max_overtime_minutes: 90, cost_per_hour_cents: spec.costCents, colour: spec.colour,
    });
  };
  DEMO_FARRIERS.forEach((spec, i) => addFarrier(1, spec, houses[i]!));
  addFarrier(2, { name: 'Orrin Maybury', qualified: true, apprentice: false, forge: true, days: [1, 2, 3, 4, 5], colour: '#be123c', costCents: 4000 }, houses[6]!);
  addFarrier(2, { name: 'Sable Dunnock', qualified: false, apprentice: false, forge: true, days: [1, 2, 3, 4, 5], colour: '#4338ca', costCents: 3500 }, houses[7]!);

  // Users (all demo accounts share one password).
  const addUser = (practiceId: number, email: string, name: string, role: string, farrierId: number | null = null) =>
    push('users', { id: nextId('users'), practice_id: practiceId, email, name, role, farrier_id: farrierId, password_hash: passwordHash });
  addUser(1, 'lead@demo.test', 'Harriet Quayle', 'lead');
  addUser(1, 'dispatcher@demo.test', 'Nell Brightwater', 'dispatcher');
  farriers.filter((f) => f.practiceId === 1).forEach((f, i) => addUser(1, `farrier${i + 1}@demo.test`, f.spec.name, 'farrier', f.id));
  addUser(2, 'dispatcher@other.test', 'Lorcan Fairweather', 'dispatcher');
  addUser(2, 'lead@other.test', 'Mina Castellane', 'lead');

  // Owners. Phone numbers use the 555-01xx block that is set aside for fiction.
  interface Owner { id: number; practiceId: number; name: string }
  const owners: Owner[] = [];
  const usedNames = new Set<string>();
  const personName = () => {
    for (;;) {
      const n = `${rng.pick(FIRST)} ${rng.pick(LAST)}`;
      if (!usedNames.has(n)) {
        usedNames.add(n);
        return n;
      }
    }
  };
  const consentAt = at(addDays(today, -200), 600);
  const addOwner = (practiceId: number, index: number) => {
    const id = nextId('owners');
    const name = personName();
    const area = index % 2 === 0 ? '859' : '502';
    const optedOut = rng.chance(0.06);
    const consent = optedOut || rng.chance(0.88);
    owners.push({ id, practiceId, name });
    push('owners', {
      id, practice_id: practiceId, name, phone: `+1${area}5550${String(100 + (index % 100)).slice(-3)}`,
      email: `${name.toLowerCase().replace(/[^a-z]+/g, '.')}@example.test`,
      text_consent_at: consent ? consentAt : null, opted_out_at: optedOut ? at(addDays(today, -30), 1140) : null,
      notes: rng.chance(0.2) ? rng.pick(['Prefers a call the evening before.', 'Pays by card on the day.', 'Usually at work; barn manager holds horses.', 'Ask for the gate code by text.']) : null,
    });
  };
  for (let i = 0; i < 60; i += 1) addOwner(1, i);
  for (let i = 0; i < 5; i += 1) addOwner(2, 60 + i);

  // Barns: one home barn per owner plus boarding stables; access hours Monday first.
  interface Barn { id: number; practiceId: number; point: AddressPoint; setup: number; ownerId: number | null; hours: [number, number][][] }
  const barns: Barn[] = [];
  const barnNames = new Set<string>();
  const addBarn = (practiceId: number, ownerId: number | null, point: AddressPoint, boarding: boolean) => {
    const id = nextId('barns');
    let name = '';
    do name = `${rng.pick(BARN_A)} ${boarding ? rng.pick(['Stables', 'Equestrian Center', 'Boarding Barn']) : rng.pick(BARN_B)}`;
    while (barnNames.has(name));
    barnNames.add(name);
    const open = rng.pick([[420, 1140], [450, 1080], [480, 1020], [420, 1200]] as [number, number][]);
    const sundayClosed = rng.chance(0.5);
    const satShort = rng.chance(0.3);
    const lunchGap = !boarding && rng.chance(0.15);
    const day = (): [number, number][] => (lunchGap ? [[open[0], 720], [780, open[1]]] : [[open[0], open[1]]]);
    const hours = [day(), day(), day(), day(), day(), satShort ? [[480, 720] as [number, number]] : day(), sundayClosed ? [] : day()];
    const setup = boarding ? 15 : rng.pick([10, 10, 12, 15]);
    barns.push({ id, practiceId, point, setup, ownerId, hours });
    push('barns', {
      id, practice_id: practiceId, owner_id: ownerId, name, address: addressText(point), address_point_id: point.id,
      lat: point.lat, lon: point.lon, access_hours: JSON.stringify(hours), setup_minutes: setup,
      notes: rng.pick([null, 'Gate code 4471; close it behind you.', 'Two dogs, friendly. Park by the hay shed.', 'Cross-ties in the wash bay; outlet by the tack room.', 'Narrow lane: leave the trailer at the road.', 'Horses are stalled in the morning; ask the manager.', null]),
    });
  };
  let farmIndex = 0;
  owners.filter((o) => o.practiceId === 1).forEach((o) => addBarn(1, o.id, farms[farmIndex++]!, false));
  for (let i = 0; i < 20; i += 1) addBarn(1, null, farms[farmIndex++]!, true);
  owners.filter((o) => o.practiceId === 2).forEach((o) => addBarn(2, o.id, farms[farmIndex++]!, false));
  addBarn(2, null, farms[farmIndex++]!, true);

  // Horses and their usual work.
  interface Horse { id: number; practiceId: number; barn: Barn; ownerId: number; cycleWeeks: number; work: string[]; lastVisit: string; secondPerson: boolean }
  const horses: Horse[] = [];
  const horseNames = new Map<number, Set<string>>();
  const addHorse = (practiceId: number, barn: Barn, ownerId: number) => {
    const id = nextId('horses');
    const r = rng.next();
    let work: string[];
    if (r < 0.4) work = ['Trim'];
    else if (r < 0.55) work = ['Front shoes'];
    else if (r < 0.75) work = ['Full set'];
    else if (r < 0.87) work = ['Reset'];
    else if (r < 0.92) work = ['Bar shoes'];
    else if (r < 0.95) work = ['Glue-on'];
    else work = ['Therapeutic'];
    const shod = !['Trim', 'Glue-on'].includes(work[0]!);
    if (shod && work[0] !== 'Therapeutic' && rng.chance(0.45)) work.push('Hot fit');
    if (shod && rng.chance(0.12)) work.push('Pads and packing');
    const cycleWeeks = work[0] === 'Trim' ? rng.pick([5, 6, 6]) : rng.pick([5, 6, 6, 7, 8]);
    // Last visit spread so the due list has overdue, due-this-week and later horses.
    const lastVisit = addDays(today, -rng.int(3, cycleWeeks * 7 + 12));
    const names = horseNames.get(barn.id) ?? new Set<string>();
    let name = '';
    do name = rng.pick(HORSE) + rng.pick(HORSE_SUFFIX);
    while (names.has(name));
    names.add(name);
    horseNames.set(barn.id, names);
    const secondPerson = rng.chance(0.08);
    horses.push({ id, practiceId, barn, ownerId, cycleWeeks, work, lastVisit, secondPerson });
    push('horses', {
      id, practice_id: practiceId, owner_id: ownerId, barn_id: barn.id, name, cycle_weeks: cycleWeeks, last_visit_on: lastVisit,
      shoe_size: shod ? rng.pick(['00', '0', '1', '2', '3']) : null, needs_second_person: secondPerson,
      notes: secondPerson ? rng.pick(['Kicks with the near hind; twitch only with the owner present.', 'Pulls back when tied; needs a holder.', 'Nervous of the forge smoke; a second person at the head.'])
        : rng.pick([null, null, null, 'Thin soles; pads in winter.', 'Toes in slightly on the left fore.', 'Easy keeper, stands well.', 'Prefers to be done first, before feed.', 'Vet follows a laminitis history: radiographs on file.']),
    });
    for (const w of work) push('horse_work_types', { horse_id: id, work_type_id: workTypeIds[practiceId]![w] });
  };
  const ownersOf = (practiceId: number) => owners.filter((o) => o.practiceId === practiceId);
  for (const barn of barns) {
    const boarding = barn.ownerId === null;
    const count = barn.practiceId === 1 ? (boarding ? rng.int(7, 13) : rng.int(2, 5)) : rng.int(2, 4);
    for (let i = 0; i < count; i += 1) {
      const ownerId = boarding ? rng.pick(ownersOf(barn.practiceId)).id : barn.ownerId!;
      addHorse(barn.practiceId, barn, ownerId);
    }
  }

  // The farrier a barn usually gets: the nearest who can do all its horses' work.
  const usualFarrier = new Map<number, Farrier>();
  for (const barn of barns) {
    const needs = horses.filter((h) => h.barn.id === barn.id).flatMap((h) => h.work.map((w) => workByName[w]!));
    const able = farriers.filter((f) => f.practiceId === barn.practiceId && needs.every((w) => (!w.forge || f.spec.forge) && (!w.qualified || f.spec.qualified)));
    const pool = able.length ? able : farriers.filter((f) => f.practiceId === barn.practiceId && f.spec.qualified);
    // Spread work: choose among the two nearest at random.
    const near = pool.slice().sort((a, b) => haversineM(a.home, barn.point) - haversineM(b.home, barn.point)).slice(0, 2);
    usualFarrier.set(barn.id, rng.pick(near));
  }

  const driveSec = (a: { lat: number; lon: number }, b: { lat: number; lon: number }) => {
    // Road distance ≈ straight line × 1.3 (a common default circuity), at 38 mph for history only.
    const m = haversineM(a, b) * 1.3;
    return { m: Math.round(m), s: Math.round(m / (38 * 0.44704)) };
  };
  const jobMinutes = (work: string[]) => work.reduce((sum, w) => sum + workByName[w]!.minutes, 0);
  const jobRevenue = (practiceId: number, work: string[]) =>
    work.reduce((sum, w) => sum + (practiceId === 1 ? workByName[w]!.priceCents : Math.round(workByName[w]!.priceCents * 0.95)), 0);

  // History: every visit of the last twelve weeks, grouped into published plans, with actual times.
  // Each day's stops go to the barn's usual farrier while they have room (about eight hours of work),
  // else to the least loaded farrier able to do the work, else to the next working day.
  const historyStart = addDays(today, -84);
  interface Visit { horse: Horse; date: string }
  const pending = new Map<string, Map<number, Visit[]>>(); // date → barn → visits
  for (const horse of horses) {
    for (let d = horse.lastVisit; d >= historyStart; d = addDays(d, -horse.cycleWeeks * 7)) {
      let date = d;
      while (isoWeekday(date) === 7) date = addDays(date, -1);
      if (date < historyStart || date >= today) continue;
      const day = pending.get(date) ?? new Map<number, Visit[]>();
      day.set(horse.barn.id, [...(day.get(horse.barn.id) ?? []), { horse, date }]);
      pending.set(date, day);
    }
  }
  const byDay = new Map<string, Map<number, Map<number, Visit[]>>>(); // date → farrier → barn → visits
  for (let date = historyStart; date < today; date = addDays(date, 1)) {
    const day = pending.get(date);
    if (!day) continue;
    const load = new Map<number, number>();
    const assigned = new Map<number, Map<number, Visit[]>>();
    const stopsToday = [...day.entries()].sort((a, b) => a[0] - b[0]);
    for (const [barnId, stopVisits] of stopsToday) {
      const barn = barns[barnId - 1]!;
      const needs = stopVisits.flatMap((v) => v.horse.work.map((w) => workByName[w]!));
      const minutes = barn.setup + stopVisits.reduce((s, v) => s + jobMinutes(v.horse.work), 0) + 25;
      const able = farriers.filter((f) => f.practiceId === barn.practiceId && f.spec.days.includes(isoWeekday(date))
        && needs.every((w) => (!w.forge || f.spec.forge) && (!w.qualified || f.spec.qualified))
        && (load.get(f.id) ?? 0) + minutes <= (f.spec.loadMinutes ?? 450));
      const usual = usualFarrier.get(barnId)!;
      const chosen = able.find((f) => f.id === usual.id) ?? able.sort((a, b) => (load.get(a.id) ?? 0) - (load.get(b.id) ?? 0))[0];
      if (!chosen) {
        let later = addDays(date, 1);
        while (isoWeekday(later) === 7) later = addDays(later, 1);
        if (later < today) {
          const next = pending.get(later) ?? new Map<number, Visit[]>();
          next.set(barnId, [...(next.get(barnId) ?? []), ...stopVisits.map((v) => ({ ...v, date: later }))]);
          pending.set(later, next);
        }
        continue;
      }
      load.set(chosen.id, (load.get(chosen.id) ?? 0) + minutes);
      const route = assigned.get(chosen.id) ?? new Map<number, Visit[]>();
      route.set(barnId, stopVisits);
      assigned.set(chosen.id, route);
    }
    if (assigned.size) byDay.set(date, assigned);
  }
  const lastVisitActual = new Map<number, string>();
  for (const date of [...byDay.keys()].sort()) {
    const perFarrier = byDay.get(date)!;
    const practiceIds = new Set([...perFarrier.keys()].map((fid) => farriers.find((f) => f.id === fid)!.practiceId));
    const planIds = new Map<number, number>();
    for (const practiceId of practiceIds) {
      const planId = nextId('plans');
      planIds.set(practiceId, planId);
      push('plans', { id: planId, practice_id: practiceId, plan_date: date, state: 'published', version: 1, published_at: at(addDays(date, -1), 1080), created_at: at(addDays(date, -1), 1050), updated_at: at(addDays(date, -1), 1080) });
    }
    for (const [farrierId, stopsByBarn] of [...perFarrier.entries()].sort((a, b) => a[0] - b[0])) {
      const farrier = farriers.find((f) => f.id === farrierId)!;
      const planId = planIds.get(farrier.practiceId)!;
      // Order stops by nearest neighbour from home.
      const remaining = [...stopsByBarn.entries()];
      const ordered: [number, Visit[]][] = [];
      let here: { lat: number; lon: number } = farrier.home;
      while (remaining.length) {
        remaining.sort((a, b) => haversineM(here, barns[a[0] - 1]!.point) - haversineM(here, barns[b[0] - 1]!.point));
        const next = remaining.shift()!;
        ordered.push(next);
        here = barns[next[0] - 1]!.point;
      }
      const routeId = nextId('routes');
      const startMin = 450;
      let planned = startMin; // minutes of the day, planned
      let actual = startMin + rng.int(-5, 12);
      let plannedDrive = 0;
      let plannedDist = 0;
      let actualDist = 0;
      let breakAt: number | null = null;
      here = farrier.home;
      const routeStops: Record<string, unknown>[] = [];
      ordered.forEach(([barnId, stopVisits], position) => {
        const barn = barns[barnId - 1]!;
        const leg = driveSec(here, barn.point);
        plannedDrive += leg.s;
        plannedDist += leg.m;
        const legActualM = Math.round(leg.m * (1 + rng.next() * 0.08));
        actualDist += legActualM;
        planned += leg.s / 60;
        actual += (leg.s / 60) * (0.9 + rng.next() * 0.35);
        const arrivalPlanned = planned;
        const startPlanned = Math.max(planned, barn.hours[isoWeekday(date) - 1]?.[0]?.[0] ?? planned);
        const workMin = barn.setup + stopVisits.reduce((s, v) => s + jobMinutes(v.horse.work), 0);
        planned = startPlanned + workMin;
        const arrivedActual = Math.max(actual, startPlanned - 10);
        const skipped = rng.chance(0.03);
        actual = arrivedActual + (skipped ? 10 : workMin * (0.85 + rng.next() * 0.4));
        if (breakAt === null && planned >= 690) {
          breakAt = planned;
          planned += 30;
          actual += 30 + rng.int(-5, 10);
        }
        const stopId = nextId('stops');
        routeStops.push({
          id: stopId, practice_id: farrier.practiceId, route_id: routeId, position, barn_id: barnId,
          arrival_at: at(date, arrivalPlanned), start_at: at(date, startPlanned), departure_at: at(date, startPlanned + workMin),
          leg_drive_seconds: leg.s, leg_distance_m: leg.m, window_start_at: at(date, Math.floor(arrivalPlanned / 15) * 15 - 30), window_end_at: at(date, Math.floor(arrivalPlanned / 15) * 15 + 30),
        });
        const visitId = nextId('visit_logs');
        push('visit_logs', {
          id: visitId, practice_id: farrier.practiceId, farrier_id: farrierId, barn_id: barnId, stop_id: stopId, visit_date: date,
          state: skipped ? 'skipped' : 'done', arrived_at: at(date, arrivedActual), departed_at: at(date, actual), distance_m: legActualM,
          skip_reason: skipped ? rng.pick(['Owner cancelled on arrival', 'Horse turned out and could not be caught', 'Barn locked']) : null,
        });
        stopVisits.forEach((v, jobPosition) => {
          const jobId = nextId('jobs');
          push('jobs', {
            id: jobId, practice_id: farrier.practiceId, horse_id: v.horse.id, minutes: jobMinutes(v.horse.work), due_on: date,
            earliest_on: addDays(date, -7), latest_on: addDays(date, 7), state: skipped ? 'skipped' : 'done',
            created_at: at(addDays(date, -10), 600), updated_at: at(date, actual),
          });
          for (const w of v.horse.work) push('job_work_types', { job_id: jobId, work_type_id: workTypeIds[farrier.practiceId]![w] });
          push('stop_jobs', { stop_id: stopId, job_id: jobId, plan_id: planId, position: jobPosition });
          if (!skipped) {
            push('visit_log_horses', { visit_log_id: visitId, horse_id: v.horse.id, job_id: jobId, work: v.horse.work.join(', '), revenue_cents: jobRevenue(farrier.practiceId, v.horse.work) });
            lastVisitActual.set(v.horse.id, date);
          }
        });
        here = barn.point;
      });
      const home = driveSec(here, farrier.home);
      plannedDrive += home.s;
      plannedDist += home.m;
      const homeActualM = Math.round(home.m * (1 + rng.next() * 0.08));
      actualDist += homeActualM;
      planned += home.s / 60;
      actual += (home.s / 60) * (0.9 + rng.next() * 0.3);
      const workSec = Math.round((planned - startMin - (breakAt === null ? 0 : 30)) * 60);
      push('routes', {
        id: routeId, practice_id: farrier.practiceId, plan_id: planId, farrier_id: farrierId, start_at: at(date, startMin), end_at: at(date, planned),
        drive_seconds: plannedDrive, distance_m: plannedDist, work_seconds: workSec, overtime_seconds: Math.max(0, workSec - 480 * 60),
        break_start_at: breakAt === null ? null : at(date, breakAt),
      });
      for (const s of routeStops) push('stops', s);
      push('day_logs', { id: nextId('day_logs'), practice_id: farrier.practiceId, farrier_id: farrierId, work_date: date, started_at: at(date, startMin + rng.int(-5, 12)), ended_at: at(date, actual), distance_m: actualDist });
    }
  }
  // Keep each horse's last visit consistent with the history just written.
  for (const row of rows.horses!) {
    const last = lastVisitActual.get(row.id as number);
    if (last) row.last_visit_on = last;
  }

  // Open jobs: every horse overdue or due within the next 14 days.
  for (const horse of horses) {
    const last = lastVisitActual.get(horse.id) ?? horse.lastVisit;
    const due = addDays(last, horse.cycleWeeks * 7);
    if (due > addDays(today, 14)) continue;
    const jobId = nextId('jobs');
    const ownerWindow = rng.chance(0.1) ? rng.pick([[540, 720], [780, 960], [480, 660]] as [number, number][]) : null;
    const lame = rng.chance(0.03);
    push('jobs', {
      id: jobId, practice_id: horse.practiceId, horse_id: horse.id, minutes: jobMinutes(horse.work) + (lame ? 60 : 0), due_on: due,
      earliest_on: addDays(due, -7), latest_on: addDays(due, 10), state: 'due', lame,
      owner_window_start_minute: ownerWindow?.[0] ?? null, owner_window_end_minute: ownerWindow?.[1] ?? null,
      notes: lame ? 'Owner reports lameness: see the vet’s notes first.' : null,
    });
    for (const w of horse.work) push('job_work_types', { job_id: jobId, work_type_id: workTypeIds[horse.practiceId]![w] });
  }

  await knex.transaction(async (trx) => {
    // Every table but knex's own bookkeeping: a table added by a later migration is emptied too.
    const [listed] = await trx.raw('SHOW TABLES');
    const tables = (listed as Record<string, string>[]).map((r) => Object.values(r)[0]!).filter((t) => !t.startsWith('knex_'));
    await trx.raw('SET FOREIGN_KEY_CHECKS = 0');
    for (const table of tables) await trx.raw('TRUNCATE TABLE ??', [table]);
    await trx.raw('SET FOREIGN_KEY_CHECKS = 1');
  });
  const order = ['practices', 'work_types', 'farriers', 'users', 'owners', 'barns', 'horses', 'horse_work_types', 'plans', 'routes', 'stops', 'jobs', 'job_work_types', 'stop_jobs', 'visit_logs', 'visit_log_horses', 'day_logs'];
  for (const table of order) {
    const list = rows[table] ?? [];
    // A multi-row insert needs the same columns in every row: a column a row leaves out gets DEFAULT.
    const columns = [...new Set(list.flatMap((r) => Object.keys(r)))];
    const uniform = list.map((r) => Object.fromEntries(columns.map((c) => [c, c in r ? r[c] : knex.raw('DEFAULT')])));
    for (let i = 0; i < uniform.length; i += 500) await knex(table).insert(uniform.slice(i, i + 500));
  }
}
