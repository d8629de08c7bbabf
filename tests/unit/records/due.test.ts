// Due dates: last visit + cycle weeks as calendar days in the practice's zone, checked against
// date-fns-tz (a general-purpose reference library from npm) computing the same dates independently.
// Daylight-saving instants for America/New_York in 2026 are from the IANA tz rules:
// 8 Mar 2026 07:00Z (EST→EDT) and 1 Nov 2026 06:00Z (EDT→EST).
import { describe, expect, it } from 'vitest';
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';
import { addDays, daysUntil, dueBucket, isIsoDate, localDate, nextDueOn } from '../../../src/lib/records/due.ts';

const NY = 'America/New_York';
const WEEK_MS = 7 * 86_400_000;

/** Independent reference: local noon of the last visit, plus whole weeks of milliseconds, read back in the zone. */
function referenceDue(lastVisit: string, cycleWeeks: number, tz: string): string {
  // Noon is at least 11 hours from either midnight, so a one-hour DST shift cannot change the date.
  const noon = fromZonedTime(`${lastVisit}T12:00:00`, tz);
  return formatInTimeZone(new Date(noon.getTime() + cycleWeeks * WEEK_MS), tz, 'yyyy-MM-dd');
}

const CASES: [string, number, string][] = [
  // [last visit, cycle weeks, why the case is here]
  ['2026-02-15', 4, 'spans the spring-forward change of 8 Mar 2026'],
  ['2026-03-07', 1, 'the day before spring forward'],
  ['2026-03-08', 6, 'the 23-hour day itself'],
  ['2026-10-18', 4, 'spans the fall-back change of 1 Nov 2026'],
  ['2026-11-01', 5, 'the 25-hour day itself'],
  ['2026-10-31', 1, 'the day before fall back'],
  ['2026-12-01', 6, 'crosses the year end into 2027'],
  ['2026-12-31', 1, 'the last day of 2026'],
  ['2025-12-20', 8, 'crosses the year end into 2026'],
  ['2028-02-01', 4, 'reaches 29 February of a leap year'],
];

describe('next due date = last visit + cycle weeks, in the practice time zone', () => {
  it.each(CASES)('%s + %i weeks (%s) matches date-fns-tz', (last, weeks) => {
    expect(nextDueOn(last, weeks)).toBe(referenceDue(last, weeks, NY));
  });

  it('matches the reference for every day of 2026 and cycles of 1–12 weeks in New York and London', () => {
    let day = '2025-12-25';
    let checked = 0;
    while (day <= '2027-01-05') {
      for (const weeks of [1, 4, 5, 6, 7, 8, 12]) {
        expect(nextDueOn(day, weeks)).toBe(referenceDue(day, weeks, NY));
        expect(nextDueOn(day, weeks)).toBe(referenceDue(day, weeks, 'Europe/London'));
        checked += 1;
      }
      day = addDays(day, 1);
    }
    // 25 Dec 2025 to 5 Jan 2027 is 7 + 365 + 5 = 377 days, × 7 cycle lengths.
    expect(checked).toBe(377 * 7);
  });

  it('hand-checked year end: 1 Dec 2026 + 6 weeks = 12 Jan 2027 (30 days to 31 Dec, 12 more)', () => {
    expect(nextDueOn('2026-12-01', 6)).toBe('2027-01-12');
  });

  it('does not fall into the midnight trap: adding 4 × 7 × 24 h to local midnight of 18 Oct 2026 lands on 14 Nov in New York', () => {
    // The trap the calendar arithmetic avoids: 2026-10-18T00:00 EDT = 04:00Z; + 28 days = 2026-11-15T04:00Z,
    // which is 23:00 EST on 14 Nov because the clocks went back an hour on 1 Nov.
    const midnight = fromZonedTime('2026-10-18T00:00:00', NY);
    expect(formatInTimeZone(new Date(midnight.getTime() + 4 * WEEK_MS), NY, 'yyyy-MM-dd')).toBe('2026-11-14');
    expect(nextDueOn('2026-10-18', 4)).toBe('2026-11-15');
  });

  it('a horse never visited has no due date and counts as due now', () => {
    expect(nextDueOn(null, 6)).toBeNull();
    expect(dueBucket(null, '2026-12-01')).toBe('this_week');
  });
});

describe("today is the practice's local date", () => {
  const INSTANTS: string[] = [
    '2026-03-08T04:59:59Z', '2026-03-08T05:00:00Z', '2026-03-08T06:59:59Z', '2026-03-08T07:00:00Z', '2026-03-09T03:59:59Z', '2026-03-09T04:00:00Z',
    '2026-11-01T03:59:59Z', '2026-11-01T04:00:00Z', '2026-11-01T05:30:00Z', '2026-11-01T06:30:00Z', '2026-11-02T04:59:59Z', '2026-11-02T05:00:00Z',
    '2026-12-31T23:59:59Z', '2027-01-01T04:59:59Z', '2027-01-01T05:00:00Z',
  ];
  it.each(INSTANTS)('%s has the same New York date as date-fns-tz gives', (iso) => {
    expect(localDate(new Date(iso), NY)).toBe(formatInTimeZone(new Date(iso), NY, 'yyyy-MM-dd'));
  });

  it('hand-checked: 2027-01-01T04:59:59Z is still 31 Dec 2026 in New York (UTC−5 in winter)', () => {
    expect(localDate(new Date('2027-01-01T04:59:59Z'), NY)).toBe('2026-12-31');
    expect(localDate(new Date('2027-01-01T05:00:00Z'), NY)).toBe('2027-01-01');
  });
});

describe('due groups: overdue before today, due this week up to 7 days ahead, later after', () => {
  it('groups around a year end (today 29 Dec 2026; 29 Dec + 7 days = 5 Jan 2027)', () => {
    expect(dueBucket('2026-12-28', '2026-12-29')).toBe('overdue');
    expect(dueBucket('2026-12-29', '2026-12-29')).toBe('this_week');
    expect(dueBucket('2027-01-05', '2026-12-29')).toBe('this_week');
    expect(dueBucket('2027-01-06', '2026-12-29')).toBe('later');
  });

  it('counts whole days across the fall-back change (25-hour day): 31 Oct → 2 Nov is 2 days', () => {
    expect(daysUntil('2026-11-02', '2026-10-31')).toBe(2);
    expect(daysUntil('2026-03-07', '2026-03-09')).toBe(-2);
  });

  it('accepts only real calendar dates', () => {
    expect(isIsoDate('2026-02-28')).toBe(true);
    expect(isIsoDate('2026-02-29')).toBe(false);
    expect(isIsoDate('2028-02-29')).toBe(true);
    expect(isIsoDate('2026-13-01')).toBe(false);
    expect(() => addDays('2026-02-30', 1)).toThrow(RangeError);
  });
});
