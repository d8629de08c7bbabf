import type { Knex } from 'knex';
import type { ImportContext, ImportPlan } from '../records/csv.ts';
import { findAddress } from '../records/addresses.ts';
import { DEFAULT_ACCESS_HOURS } from '../../schemas/barns.ts';

/** Loads what the import matches rows against: barns, work types, owners and current horses. */
export async function loadImportContext(db: Knex | Knex.Transaction, practiceId: number, today: string): Promise<ImportContext> {
  const [barns, work, owners, horses] = await Promise.all([
    db('barns').where({ practice_id: practiceId }).whereNull('archived_at').select('id', 'name'),
    db('work_types').where({ practice_id: practiceId }).whereNull('archived_at').select('id', 'name'),
    db('owners').where({ practice_id: practiceId }).whereNull('archived_at').select('id', 'name', 'phone'),
    db('horses').where({ practice_id: practiceId }).whereNull('archived_at').select('owner_id', 'barn_id', 'name'),
  ]);
  const ownersByName = new Map<string, { id: number; phone: string | null }>();
  for (const o of owners) if (!ownersByName.has(o.name.toLowerCase())) ownersByName.set(o.name.toLowerCase(), { id: o.id, phone: o.phone });
  return {
    barnsByName: new Map(barns.map((b) => [b.name.toLowerCase(), b.id])),
    workTypesByName: new Map(work.map((w) => [w.name.toLowerCase(), w.id])),
    ownersByPhone: new Map(owners.filter((o) => o.phone).map((o) => [o.phone, { id: o.id, name: o.name }])),
    ownersByName,
    horseKeys: new Set(horses.map((h) => `${h.owner_id}|${h.barn_id}|${String(h.name).toLowerCase()}`)),
    findAddress,
    today,
  };
}

/**
 * Writes a checked plan: new owners, new barns, then the horses with their usual work. Call inside
 * one transaction so that a failure part-way leaves nothing behind.
 */
export async function writeImport(trx: Knex.Transaction, practiceId: number, plan: ImportPlan): Promise<{ owners: number; barns: number; horses: number; horseIds: number[] }> {
  const ownerIds = new Map<string, number>();
  const now = new Date();
  for (const [key, o] of plan.newOwners) {
    const [id] = await trx('owners').insert({ practice_id: practiceId, name: o.name, phone: o.phone, email: o.email, text_consent_at: o.textConsent ? now : null });
    ownerIds.set(key, Number(id));
  }
  const barnIds = new Map<string, number>();
  for (const [key, b] of plan.newBarns) {
    const [id] = await trx('barns').insert({ practice_id: practiceId, name: b.name, address: b.address, address_point_id: b.addressPointId, lat: b.lat, lon: b.lon, access_hours: JSON.stringify(DEFAULT_ACCESS_HOURS), setup_minutes: 10 });
    barnIds.set(key, Number(id));
  }
  const horseIds: number[] = [];
  for (const h of plan.horses) {
    const ownerId = 'existing' in h.owner ? h.owner.existing : ownerIds.get(h.owner.newKey)!;
    const barnId = 'existing' in h.barn ? h.barn.existing : barnIds.get(h.barn.newKey)!;
    const [id] = await trx('horses').insert({ practice_id: practiceId, owner_id: ownerId, barn_id: barnId, name: h.name, cycle_weeks: h.cycleWeeks, last_visit_on: h.lastVisitOn, shoe_size: h.shoeSize, notes: h.notes });
    if (h.workTypeIds.length) await trx('horse_work_types').insert(h.workTypeIds.map((w) => ({ horse_id: Number(id), work_type_id: w })));
    horseIds.push(Number(id));
  }
  return { owners: ownerIds.size, barns: barnIds.size, horses: horseIds.length, horseIds };
}
