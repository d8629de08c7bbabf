// CSV import checks: every bad row is listed with its reasons, and rows already on record are left alone.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { guessMapping, parseCsv, parseVisitDate, planImport, type ImportContext } from '../../../src/lib/records/csv.ts';
import { toE164 } from '../../../src/lib/records/phone.ts';
import { findAddress } from '../../../src/lib/records/addresses.ts';
import { importMappingSchema } from '../../../src/schemas/import.ts';

function context(over: Partial<ImportContext> = {}): ImportContext {
  return {
    barnsByName: new Map([['quarry equestrian center', 61], ['buckthorn boarding barn', 62], ['quarry boarding barn', 63]]),
    workTypesByName: new Map([['trim', 1], ['front shoes', 2], ['full set', 3], ['reset', 4], ['hot fit', 5], ['pads and packing', 6], ['bar shoes', 7]]),
    ownersByPhone: new Map(),
    ownersByName: new Map(),
    horseKeys: new Set(),
    findAddress,
    today: '2026-12-01',
    ...over,
  };
}

const HEADER = 'Owner name,Owner phone,Barn name,Barn address,Horse name,Cycle weeks,Last visit,Usual work';

describe('phone numbers become E.164 (libphonenumber-js metadata) or are refused', () => {
  it('converts the usual US ways of writing a number', () => {
    for (const v of ['(859) 555-0142', '859.555.0142', '859-555-0142', '+1 859 555 0142', '+18595550142']) expect(toE164(v)).toBe('+18595550142');
  });
  it('refuses numbers that cannot be dialled', () => {
    for (const v of ['555-0142', '12345', 'call me', '+1 000 555 0142', '']) expect(toE164(v)).toBeNull();
  });
});

describe('planning an import', () => {
  it('guesses the mapping from headers equal to the field labels', () => {
    const parsed = parseCsv(readFileSync('public/samples/demo-owners.csv', 'utf8'));
    const mapping = guessMapping(parsed.headers);
    expect(mapping).toMatchObject({ ownerName: 'Owner name', ownerPhone: 'Owner phone', barnName: 'Barn name', horseName: 'Horse name', work: 'Usual work', lastVisitOn: 'Last visit' });
    expect(importMappingSchema.safeParse(mapping).success).toBe(true);
  });

  it('the shipped sample file has no bad rows against the demo barns and work types', () => {
    const parsed = parseCsv(readFileSync('public/samples/demo-owners.csv', 'utf8'));
    const plan = planImport(parsed, importMappingSchema.parse(guessMapping(parsed.headers)), context({ workTypesByName: new Map([...context().workTypesByName]) }));
    expect(plan.badRows).toEqual([]);
    // 8 rows: 5 owners (Marnie, Osric, Tamsin, Jory, Wilhelmina), 3 new barns placed by position, 8 horses.
    expect(plan.newOwners.size).toBe(5);
    expect(plan.newBarns.size).toBe(3);
    expect(plan.horses).toHaveLength(8);
  });

  it('lists every bad row with all of its reasons, numbered by file line', () => {
    const csv = [
      HEADER,
      ',(859) 555-0190,Quarry Boarding Barn,,Nameless Owner Horse,6,2026-10-01,Trim', // line 2: no owner name
      'Ivy Calloway,555-0142,Quarry Boarding Barn,,Tansy,6,2026-10-01,Trim', // line 3: bad phone
      'Ivy Calloway,(859) 555-0191,Nowhere Barn,,Tansy,6,2026-10-01,Trim', // line 4: unknown barn, no address
      'Ivy Calloway,(859) 555-0191,Quarry Boarding Barn,,Tansy,6,2026-10-01,Trim', // line 5: good
      'Ivy Calloway,(859) 555-0191,Quarry Boarding Barn,,Tansy,6,2026-10-01,Trim', // line 6: duplicate of 5
      'Ivy Calloway,(859) 555-0191,Quarry Boarding Barn,,,6,2026-10-01,Trim', // line 7: no horse name
      'Ivy Calloway,(859) 555-0191,Quarry Boarding Barn,,Burdock,0,2027-01-01,Shoeing', // line 8: cycle, future date, unknown work
      'Ivy Calloway,(859) 555-0191,Fresh Barn,"1 Nowhere Lane, Atlantis",Teasel,6,,Trim', // line 9: address not in the region
    ].join('\n');
    const parsed = parseCsv(csv);
    const plan = planImport(parsed, importMappingSchema.parse(guessMapping(parsed.headers)), context());
    const byLine = Object.fromEntries(plan.badRows.map((b) => [b.line, b.reasons.join(' | ')]));
    expect(Object.keys(byLine).map(Number)).toEqual([2, 3, 4, 6, 7, 8, 9]);
    expect(byLine[2]).toMatch(/Owner name is missing/);
    expect(byLine[3]).toMatch(/cannot be turned into an E\.164 number/);
    expect(byLine[4]).toMatch(/Unknown barn "Nowhere Barn"/);
    expect(byLine[6]).toMatch(/Duplicate of line 5/);
    expect(byLine[7]).toMatch(/Horse name is missing/);
    expect(byLine[8]).toMatch(/Cycle weeks "0"/);
    expect(byLine[8]).toMatch(/in the future/);
    expect(byLine[8]).toMatch(/Unknown work type "Shoeing"/);
    expect(byLine[9]).toMatch(/not one of the region's address points/);
    expect(plan.horses.map((h) => h.line)).toEqual([5]);
  });

  it('a row whose horse is already on record (same owner, barn, name) is unchanged, not new', () => {
    const parsed = parseCsv(`${HEADER}\nIvy Calloway,(859) 555-0191,Quarry Boarding Barn,,Tansy,6,2026-10-01,Trim`);
    const ctx = context({ ownersByPhone: new Map([['+18595550191', { id: 900, name: 'Ivy Calloway' }]]), horseKeys: new Set(['900|63|tansy']) });
    const plan = planImport(parsed, importMappingSchema.parse(guessMapping(parsed.headers)), ctx);
    expect(plan.badRows).toEqual([]);
    expect(plan.horses).toEqual([]);
    expect(plan.unchanged).toEqual([2]);
  });

  it('refuses a phone that belongs to a different owner on record', () => {
    const parsed = parseCsv(`${HEADER}\nSomeone Else,(859) 555-0191,Quarry Boarding Barn,,Tansy,6,2026-10-01,Trim`);
    const plan = planImport(parsed, importMappingSchema.parse(guessMapping(parsed.headers)), context({ ownersByPhone: new Map([['+18595550191', { id: 900, name: 'Ivy Calloway' }]]) }));
    expect(plan.badRows[0]?.reasons[0]).toMatch(/belongs to owner Ivy Calloway/);
  });

  it('reads ISO and US month-first dates, and nothing else', () => {
    expect(parseVisitDate('2026-03-08')).toBe('2026-03-08');
    expect(parseVisitDate('3/8/2026')).toBe('2026-03-08');
    expect(parseVisitDate('13/8/2026')).toBeNull();
    expect(parseVisitDate('8 March')).toBeNull();
  });
});
