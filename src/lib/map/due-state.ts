/**
 * A barn's due state on the map, from its open jobs: overdue work first, then work due within a week,
 * then work already booked, else later. "Within a week" matches the due list's this-week view.
 */
export type BarnDueState = 'overdue' | 'due_soon' | 'later' | 'booked';

/** Days ahead that count as due soon. */
export const DUE_SOON_DAYS = 7;

function addDays(isoDate: string, days: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/**
 * @param earliestUnplannedDue the earliest due date (YYYY-MM-DD) among the barn's jobs still in state `due`
 * @param bookedJobs how many of its open jobs are planned, booked or in progress
 * @param today the practice's local date (YYYY-MM-DD)
 */
export function barnDueState(earliestUnplannedDue: string | null, bookedJobs: number, today: string): BarnDueState {
  if (earliestUnplannedDue !== null && earliestUnplannedDue < today) return 'overdue';
  if (earliestUnplannedDue !== null && earliestUnplannedDue <= addDays(today, DUE_SOON_DAYS)) return 'due_soon';
  if (bookedJobs > 0) return 'booked';
  return 'later';
}
