import type { ReviewFigures, ReviewResult } from './compute.ts';
import { unitLabel } from './mileage.ts';

/**
 * The review table's columns, shared by the page and the CSV export so both show the same figures
 * with the same rounding: hours as h:mm from whole minutes, distance to a tenth, money to the cent.
 */
export interface ReviewColumn {
  key: keyof ReviewFigures;
  label: string;
  kind: 'minutes' | 'distance' | 'money' | 'count';
  /** Group heading on the page: which comparison the column belongs to. */
  group: 'Hours' | 'Overtime' | 'Distance' | 'Work' | 'Revenue';
}

export const REVIEW_COLUMNS: ReviewColumn[] = [
  { key: 'plannedMinutes', label: 'Planned hours', kind: 'minutes', group: 'Hours' },
  { key: 'actualMinutes', label: 'Actual hours', kind: 'minutes', group: 'Hours' },
  { key: 'driveMinutes', label: 'Drive (planned)', kind: 'minutes', group: 'Hours' },
  { key: 'plannedOvertimeMinutes', label: 'Planned overtime', kind: 'minutes', group: 'Overtime' },
  { key: 'overtimeMinutes', label: 'Actual overtime', kind: 'minutes', group: 'Overtime' },
  { key: 'overtimeCost', label: 'Overtime cost', kind: 'money', group: 'Overtime' },
  { key: 'plannedDistance', label: 'Planned distance', kind: 'distance', group: 'Distance' },
  { key: 'actualDistance', label: 'Actual distance', kind: 'distance', group: 'Distance' },
  { key: 'mileageCost', label: 'Mileage cost', kind: 'money', group: 'Distance' },
  // Days whose actual distance is the planned route's (no odometer readings on the day sheet): not measured.
  { key: 'plannedDistanceDays', label: 'Days at planned distance', kind: 'count', group: 'Distance' },
  { key: 'horsesPlanned', label: 'Horses planned', kind: 'count', group: 'Work' },
  { key: 'horsesDone', label: 'Horses done', kind: 'count', group: 'Work' },
  { key: 'stopsSkipped', label: 'Stops skipped', kind: 'count', group: 'Work' },
  { key: 'plannedRevenue', label: 'Planned revenue', kind: 'money', group: 'Revenue' },
  { key: 'revenue', label: 'Revenue', kind: 'money', group: 'Revenue' },
];

/** Whole minutes as h:mm (e.g. 2,485 → "41:25"); a spreadsheet reads it as a duration. */
export function formatMinutes(totalMinutes: number): string {
  const sign = totalMinutes < 0 ? '-' : '';
  const m = Math.abs(Math.round(totalMinutes));
  return `${sign}${Math.floor(m / 60)}:${String(m % 60).padStart(2, '0')}`;
}

/** A column's figure as plain text without grouping or currency sign: the CSV form. */
export function plainFigure(column: ReviewColumn, value: number): string {
  switch (column.kind) {
    case 'minutes':
      return formatMinutes(value);
    case 'distance':
      return value.toFixed(1);
    case 'money':
      return value.toFixed(2);
    default:
      return String(value);
  }
}

/** A column's figure for the page: the plain figure with thousands grouping and currency sign. */
export function displayFigure(column: ReviewColumn, value: number, currency: string): string {
  switch (column.kind) {
    case 'money':
      return new Intl.NumberFormat('en-US', { style: 'currency', currency, minimumFractionDigits: 2 }).format(value);
    case 'distance':
      return new Intl.NumberFormat('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(value);
    default:
      return plainFigure(column, value);
  }
}

/** A column heading with its unit, as the CSV and the page's header title show it. */
export function columnHeading(column: ReviewColumn, result: Pick<ReviewResult, 'units' | 'currency'>): string {
  if (column.kind === 'minutes') return `${column.label} (h:mm)`;
  if (column.kind === 'distance') return `${column.label} (${unitLabel(result.units)})`;
  if (column.kind === 'money') return `${column.label} (${result.currency})`;
  return column.label;
}

/** Quotes a CSV field when it holds a comma, quote or line break (RFC 4180). */
function csvField(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/**
 * The review table as CSV (RFC 4180, CRLF line ends): one row per farrier and a team total row, the
 * same columns and figures as the page.
 */
export function reviewCsv(result: ReviewResult): string {
  const header = ['Farrier', ...REVIEW_COLUMNS.map((c) => columnHeading(c, result))];
  const lines = [header];
  for (const f of result.farriers) lines.push([f.name, ...REVIEW_COLUMNS.map((c) => plainFigure(c, f[c.key]))]);
  lines.push(['Team total', ...REVIEW_COLUMNS.map((c) => plainFigure(c, result.totals[c.key]))]);
  return lines.map((l) => l.map(csvField).join(',')).join('\r\n') + '\r\n';
}
