/**
 * CSV import of owners with their horses and barns: parsing (papaparse), guessing the column mapping,
 * and checking every row against the practice's records before anything is written. Pure: the caller
 * loads the practice's records into an ImportContext and writes the plan in one transaction.
 */
import Papa from 'papaparse';
import { IMPORT_FIELDS, type ImportField, type ImportMapping } from '../../schemas/import.ts';
import { toE164 } from './phone.ts';
import { isIsoDate } from './due.ts';

export interface ParsedCsv {
  headers: string[];
  rows: Record<string, string>[];
}

/** Parses CSV text with a header row; blank lines are skipped, cells trimmed. */
export function parseCsv(text: string): ParsedCsv {
  const result = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim(),
    transform: (v) => v.trim(),
  });
  return { headers: (result.meta.fields ?? []).filter((h) => h !== ''), rows: result.data };
}

const squash = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');

/** A first guess at the mapping: a header equal to a field's key or label (ignoring case and spaces). */
export function guessMapping(headers: string[]): Partial<Record<ImportField, string>> {
  const mapping: Partial<Record<ImportField, string>> = {};
  for (const f of IMPORT_FIELDS) {
    const candidates = [squash(f.key), squash(f.label), squash(f.label.replace(/\(.*\)/, ''))];
    const found = headers.find((h) => candidates.includes(squash(h)));
    if (found) mapping[f.key] = found;
  }
  return mapping;
}

/** What the practice already has, keyed for look-ups (names lower-cased). */
export interface ImportContext {
  barnsByName: Map<string, number>;
  workTypesByName: Map<string, number>;
  ownersByPhone: Map<string, { id: number; name: string }>;
  ownersByName: Map<string, { id: number; phone: string | null }>;
  /** `${ownerId}|${barnId}|${horse name lower-cased}` of current horses. */
  horseKeys: Set<string>;
  /** The address point for a barn address, from the region's own list. */
  findAddress: (text: string) => { id: string; text: string; lat: number; lon: number } | null;
  /** The practice's local date, so a last visit in the future is refused. */
  today: string;
}

export type OwnerRef = { existing: number } | { newKey: string };
export type BarnRef = { existing: number } | { newKey: string };

/** One good row, resolved to existing records or to records the commit will create. */
export interface PlannedHorse {
  line: number;
  owner: OwnerRef;
  barn: BarnRef;
  name: string;
  cycleWeeks: number;
  lastVisitOn: string | null;
  workTypeIds: number[];
  shoeSize: string | null;
  notes: string | null;
}

export interface ImportPlan {
  rows: number;
  badRows: { line: number; reasons: string[] }[];
  newOwners: Map<string, { name: string; phone: string | null; email: string | null; textConsent: boolean }>;
  newBarns: Map<string, { name: string; address: string; addressPointId: string | null; lat: number; lon: number }>;
  horses: PlannedHorse[];
  /** Rows whose horse is already on record (same owner, barn and name): re-importing changes nothing. */
  unchanged: number[];
}

/** "2026-03-08", "3/8/2026" or "03/08/2026" (US month first) → YYYY-MM-DD, else null. */
export function parseVisitDate(v: string): string | null {
  if (isIsoDate(v)) return v;
  const m = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/.exec(v);
  if (!m) return null;
  const iso = `${m[3]}-${m[1]!.padStart(2, '0')}-${m[2]!.padStart(2, '0')}`;
  return isIsoDate(iso) ? iso : null;
}

const YES = new Set(['yes', 'y', 'true', '1', 'x']);
const NO = new Set(['no', 'n', 'false', '0', '']);

/**
 * Checks every row and resolves it; a row with any problem is listed with all its reasons (missing
 * name, phone not convertible to E.164, unknown barn, unknown work, bad date, duplicate, …). Lines are
 * numbered as in the file, the header being line 1.
 */
export function planImport(parsed: ParsedCsv, mapping: ImportMapping, ctx: ImportContext): ImportPlan {
  const plan: ImportPlan = { rows: parsed.rows.length, badRows: [], newOwners: new Map(), newBarns: new Map(), horses: [], unchanged: [] };
  const seen = new Map<string, number>();
  const phoneNames = new Map<string, string>();
  const cell = (row: Record<string, string>, f: ImportField) => (mapping[f] ? (row[mapping[f]!] ?? '').trim() : '');

  parsed.rows.forEach((row, index) => {
    const line = index + 2;
    const reasons: string[] = [];
    const ownerName = cell(row, 'ownerName');
    const horseName = cell(row, 'horseName');
    const barnName = cell(row, 'barnName');
    if (!ownerName) reasons.push('Owner name is missing');
    if (!horseName) reasons.push('Horse name is missing');
    if (!barnName) reasons.push('Barn name is missing');
    if (ownerName.length > 120 || horseName.length > 80 || barnName.length > 120) reasons.push('A name is too long');

    const rawPhone = cell(row, 'ownerPhone');
    const phone = rawPhone ? toE164(rawPhone) : null;
    if (rawPhone && !phone) reasons.push(`Phone "${rawPhone}" cannot be turned into an E.164 number`);
    const email = cell(row, 'ownerEmail') || null;
    if (email && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email)) reasons.push(`E-mail "${email}" is not an address`);
    const consentText = cell(row, 'textConsent').toLowerCase();
    if (!YES.has(consentText) && !NO.has(consentText)) reasons.push(`Text consent "${cell(row, 'textConsent')}" is not yes or no`);

    // The owner: by phone when given, else by name.
    let owner: OwnerRef | null = null;
    if (ownerName && !(rawPhone && !phone)) {
      if (phone) {
        const byPhone = ctx.ownersByPhone.get(phone);
        const fileName = phoneNames.get(phone);
        if (byPhone && byPhone.name.toLowerCase() !== ownerName.toLowerCase()) reasons.push(`Phone ${phone} belongs to owner ${byPhone.name}`);
        else if (fileName && fileName.toLowerCase() !== ownerName.toLowerCase()) reasons.push(`Phone ${phone} is given for ${fileName} on another line`);
        else owner = byPhone ? { existing: byPhone.id } : { newKey: `phone:${phone}` };
      } else {
        const byName = ctx.ownersByName.get(ownerName.toLowerCase());
        owner = byName ? { existing: byName.id } : { newKey: `name:${ownerName.toLowerCase()}` };
      }
    }

    // The barn: one of the practice's, or a new one at an address of the region.
    let barn: BarnRef | null = null;
    if (barnName) {
      const existing = ctx.barnsByName.get(barnName.toLowerCase());
      if (existing) barn = { existing };
      else {
        const address = cell(row, 'barnAddress');
        const point = address ? ctx.findAddress(address) : null;
        const latText = cell(row, 'barnLat');
        const lonText = cell(row, 'barnLon');
        const lat = Number(latText);
        const lon = Number(lonText);
        const pinned = latText !== '' && lonText !== '' && Number.isFinite(lat) && Number.isFinite(lon) && Math.abs(lat) <= 90 && Math.abs(lon) <= 180;
        if ((latText !== '' || lonText !== '') && !pinned) reasons.push(`Barn position "${latText}, ${lonText}" is not a latitude and longitude`);
        const key = barnName.toLowerCase();
        const already = plan.newBarns.get(key);
        // A barn not on record is added when the row places it: an address of the region's address
        // points, or an address with a hand-set position (latitude and longitude).
        const placed = point ? { address: point.text, addressPointId: point.id as string | null, lat: point.lat, lon: point.lon } : pinned && address ? { address, addressPointId: null, lat, lon } : null;
        if (!placed) reasons.push(address ? `Unknown barn "${barnName}": address "${address}" is not one of the region's address points and no position is given` : `Unknown barn "${barnName}": not one of your barns, and no address given to add it`);
        else if (already && (already.address !== placed.address || already.lat !== placed.lat || already.lon !== placed.lon)) reasons.push(`Barn "${barnName}" is given two different places`);
        else barn = { newKey: key };
        if (placed && !already && reasons.length === 0) plan.newBarns.set(key, { name: barnName, ...placed });
      }
    }

    const cycleText = cell(row, 'cycleWeeks');
    const cycleWeeks = cycleText === '' ? 6 : Number(cycleText);
    if (!Number.isInteger(cycleWeeks) || cycleWeeks < 1 || cycleWeeks > 26) reasons.push(`Cycle weeks "${cycleText}" is not a whole number from 1 to 26`);
    const visitText = cell(row, 'lastVisitOn');
    const lastVisitOn = visitText ? parseVisitDate(visitText) : null;
    if (visitText && !lastVisitOn) reasons.push(`Last visit "${visitText}" is not a date (use 2026-03-08 or 3/8/2026)`);
    else if (lastVisitOn && lastVisitOn > ctx.today) reasons.push(`Last visit ${lastVisitOn} is in the future`);

    const workNames = cell(row, 'work').split(/[;|]/).map((w) => w.trim()).filter(Boolean);
    const workTypeIds: number[] = [];
    if (workNames.length === 0) reasons.push('Usual work is missing');
    for (const w of workNames) {
      const wid = ctx.workTypesByName.get(w.toLowerCase());
      if (wid) workTypeIds.push(wid);
      else reasons.push(`Unknown work type "${w}"`);
    }

    const key = `${ownerName.toLowerCase()}|${phone ?? ''}|${barnName.toLowerCase()}|${horseName.toLowerCase()}`;
    const first = seen.get(key);
    if (first !== undefined && ownerName && horseName) reasons.push(`Duplicate of line ${first}`);
    else seen.set(key, line);

    if (reasons.length > 0 || !owner || !barn) {
      plan.badRows.push({ line, reasons: reasons.length ? reasons : ['Row could not be read'] });
      return;
    }
    if (phone) phoneNames.set(phone, ownerName);
    if ('newKey' in owner && !plan.newOwners.has(owner.newKey)) {
      plan.newOwners.set(owner.newKey, { name: ownerName, phone, email, textConsent: YES.has(consentText) });
    }
    if ('existing' in owner && 'existing' in barn && ctx.horseKeys.has(`${owner.existing}|${barn.existing}|${horseName.toLowerCase()}`)) {
      plan.unchanged.push(line);
      return;
    }
    plan.horses.push({ line, owner, barn, name: horseName, cycleWeeks, lastVisitOn, workTypeIds: [...new Set(workTypeIds)], shoeSize: cell(row, 'shoeSize') || null, notes: cell(row, 'horseNotes') || null });
  });
  return plan;
}

/** The plan as the preview shows it. */
export function planSummary(plan: ImportPlan) {
  return {
    rows: plan.rows,
    badRows: plan.badRows,
    newOwners: plan.newOwners.size,
    newBarns: plan.newBarns.size,
    newHorses: plan.horses.length,
    unchanged: plan.unchanged.length,
    horses: plan.horses.slice(0, 200).map((h) => ({ line: h.line, name: h.name, cycleWeeks: h.cycleWeeks, lastVisitOn: h.lastVisitOn })),
  };
}
