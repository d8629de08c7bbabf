import type { PlanWarning } from '../../schemas/plans.ts';
import type { UnplannedReason } from '../solver/index.ts';

/**
 * Dispatch's plain words: why a job is unplanned, what a hand edit breaks, and the short safety
 * cautions beside a job or route. Kept in one place so the board, the API and the tests agree.
 */

/**
 * Reasons the engine gives (see src/lib/solver/diagnose.ts) plus dispatch's own. Typed over the
 * engine's reason codes, so a code added there without words here fails the type check.
 */
export const UNPLANNED_WORDS: Record<UnplannedReason | 'barn_closed_today' | 'taken_off', string> = {
  no_farrier_working: 'No farrier is working this day',
  pinned_farrier_unavailable: 'Pinned to a farrier who is not working this day',
  pinned_farrier_unfit: 'Pinned to a farrier without the forge or qualification this work needs',
  no_qualified_farrier: 'Needs a farrier qualified for therapeutic work; none is working this day',
  no_forge_farrier: 'Needs a forge; no truck with a forge is out this day',
  no_qualified_forge_farrier: 'Needs a qualified farrier with a forge; nobody working has both',
  over_capacity: 'More than any truck can carry',
  no_common_window: "The owner's window never meets the barn's hours",
  longer_than_any_shift: 'Too long to fit in any farrier’s day, with the drive there and back',
  barn_closed_during_shifts: 'The barn is closed while the farriers are out',
  barn_closed_today: 'The barn is closed on this weekday',
  no_feasible_route_alone: 'Breaks a rule even as the only stop (break or overtime limit)',
  no_room: 'No room left in the day; kept for a later plan',
  taken_off: 'Taken off the plan by the dispatcher',
};

export function unplannedWords(reason: string): string {
  return (UNPLANNED_WORDS as Record<string, string>)[reason] ?? 'Not planned';
}

export interface WarningContext {
  farrierName: string;
  horseName?: string;
  barnName?: string;
  /** Barn hours of the day as text, e.g. "07:00–17:00". */
  barnHours?: string;
  ownerWindow?: string;
  arrival?: string;
  home?: string;
  shiftEnd?: string;
  overtimeMinutes?: number;
  maxOvertimeMinutes?: number;
  breakBy?: string;
}

/** A checker violation, turned into the board's words with the names of the people and places. */
export function warningFor(code: string, c: WarningContext, jobId?: number, ownerWindowMissed = false): PlanWarning {
  const horse = c.horseName ?? 'This horse';
  const w = (code: PlanWarning['code'], message: string): PlanWarning => (jobId === undefined ? { code, message } : { code, message, jobId });
  switch (code) {
    case 'window_missed':
      return ownerWindowMissed
        ? w('owner_window', `Outside the owner's window: ${horse} at ${c.barnName} wants ${c.ownerWindow}; the farrier is there at ${c.arrival}`)
        : w('barn_closed', `Barn closed at arrival: ${c.barnName} is open ${c.barnHours || 'at no time this day'}; ${horse} cannot be done there at ${c.arrival}`);
    case 'shift_end_exceeded':
      return w('past_shift', `Past the shift: ${c.farrierName} gets home at ${c.home}; the shift ends at ${c.shiftEnd} with ${c.maxOvertimeMinutes} min overtime allowed`);
    case 'overtime_exceeded':
      return w('overtime_limit', `Overtime over the limit: ${c.overtimeMinutes} min, ${c.farrierName}'s limit is ${c.maxOvertimeMinutes} min`);
    case 'no_forge':
      return w('no_forge', `No forge: ${horse} needs hot work; ${c.farrierName}'s truck has no forge`);
    case 'not_qualified':
      return w('not_qualified', `Not qualified: ${horse} needs therapeutic work; ${c.farrierName} is not qualified for it`);
    case 'pinned_elsewhere':
      return w('pinned_elsewhere', `${horse} is pinned to another farrier`);
    case 'pin_position':
      return w('pin_position', `${horse} is pinned to another stop position`);
    case 'break_missed':
      return w('break_missed', `No break: ${c.farrierName} cannot take the break by ${c.breakBy}`);
    default:
      return w('other', `${c.farrierName}'s route breaks a rule (${code})`);
  }
}

/** Short cautions for a job (common practice; Roundsmith defers to the farrier and the vet). */
export function jobCautions(job: { workTypes: { name: string; needsForge: boolean; needsQualified: boolean }[]; secondPerson: boolean; lame: boolean }): string[] {
  const out: string[] = [];
  if (job.workTypes.some((w) => w.needsForge)) out.push('Hot fit: burns, smoke and fumes; forge on stable ground, away from bedding');
  if (job.secondPerson) out.push('Second person to hold: kick risk');
  if (job.workTypes.some((w) => w.needsQualified)) out.push("Therapeutic work: follow the horse's vet");
  if (job.lame) out.push('Lame: consult the vet before work; sedation by a vet only');
  return out;
}

/** A route's caution about time at the wheel (common practice threshold of 3 h driving or a 10-h day). */
export function routeCautions(driveSec: number, daySec: number): string[] {
  const out: string[] = [];
  if (driveSec >= 3 * 3600) out.push(`Long drive: ${Math.round(driveSec / 360) / 10} h at the wheel; plan rests`);
  if (daySec >= 10 * 3600) out.push(`Long day: ${Math.round(daySec / 360) / 10} h; mind fatigue on the drive home`);
  return out;
}
