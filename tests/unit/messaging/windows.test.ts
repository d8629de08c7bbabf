import { describe, expect, it } from 'vitest';
import { arrivalWindow, movedBeyond, roundToQuarter, DEFAULT_WINDOW } from '../../../src/lib/messaging/arrival-window.ts';
import { arrivalKey, windowOfKey, visitKeyPrefix } from '../../../src/lib/messaging/arrival-texts.ts';

const at = (iso: string) => new Date(iso);
const hhmm = (d: Date) => d.toISOString().slice(11, 16);

// The rule is Roundsmith's own (no outside source): planned arrival rounded to 15 minutes, a centred
// window of at least 60 minutes widening by 15 per later stop, up to 180. Expected values below are
// computed by hand from that rule.
describe('arrival windows along a route', () => {
  it('rounds the planned arrival to the nearest quarter hour', () => {
    expect(hhmm(roundToQuarter(at('2027-03-02T14:07:29Z')))).toBe('14:00');
    expect(hhmm(roundToQuarter(at('2027-03-02T14:07:30Z')))).toBe('14:15'); // halfway rounds up
    expect(hhmm(roundToQuarter(at('2027-03-02T14:52:00Z')))).toBe('14:45'); // 7 min past 14:45, 8 before 15:00
    expect(hhmm(roundToQuarter(at('2027-03-02T14:53:00Z')))).toBe('15:00');
  });

  it('gives a route of five stops windows that widen with the position', () => {
    const arrivals = ['13:32', '14:41', '15:58', '17:10', '18:20'];
    const windows = arrivals.map((t, i) => arrivalWindow(at(`2027-03-02T${t}:00Z`), i + 1, DEFAULT_WINDOW));
    // stop 1: 13:32 → 13:30, width 60 → ±30 → 13:00–14:00
    // stop 2: 14:41 → 14:45, width 75 → rounded up to 90 → ±45 → 14:00–15:30
    // stop 3: 15:58 → 16:00, width 90 → ±45 → 15:15–16:45
    // stop 4: 17:10 → 17:15, width 105 → 120 → ±60 → 16:15–18:15
    // stop 5: 18:20 → 18:15, width 120 → ±60 → 17:15–19:15
    expect(windows.map((w) => `${hhmm(w.startAt)}-${hhmm(w.endAt)}`)).toEqual(['13:00-14:00', '14:00-15:30', '15:15-16:45', '16:15-18:15', '17:15-19:15']);
    for (let i = 1; i < windows.length; i++) {
      const width = (w: (typeof windows)[number]) => w.endAt.getTime() - w.startAt.getTime();
      expect(width(windows[i]!)).toBeGreaterThanOrEqual(width(windows[i - 1]!));
    }
  });

  it('never goes below the minimum nor above the maximum width', () => {
    const first = arrivalWindow(at('2027-03-02T10:00:00Z'), 1, { minMinutes: 60, growthMinutes: 15, maxMinutes: 180 });
    expect((first.endAt.getTime() - first.startAt.getTime()) / 60_000).toBe(60);
    // stop 30: 60 + 29 × 15 = 495 → capped at 180
    const late = arrivalWindow(at('2027-03-02T10:00:00Z'), 30, { minMinutes: 60, growthMinutes: 15, maxMinutes: 180 });
    expect((late.endAt.getTime() - late.startAt.getTime()) / 60_000).toBe(180);
  });

  it('sends an update only when an end moves more than the threshold', () => {
    const told = { startAt: at('2027-03-02T13:00:00Z'), endAt: at('2027-03-02T14:00:00Z') };
    const shift = (min: number) => ({ startAt: new Date(told.startAt.getTime() + min * 60_000), endAt: new Date(told.endAt.getTime() + min * 60_000) });
    expect(movedBeyond(told, shift(15), 30)).toBe(false);
    expect(movedBeyond(told, shift(30), 30)).toBe(false); // exactly the threshold: not more than it
    expect(movedBeyond(told, shift(45), 30)).toBe(true);
    expect(movedBeyond(told, shift(-45), 30)).toBe(true);
    // widening by 15 at each end stays within a 30-minute threshold
    expect(movedBeyond(told, { startAt: shift(-15).startAt, endAt: shift(15).endAt }, 30)).toBe(false);
  });

  it('names one visit and one window in the idempotency key, and reads the window back from it', () => {
    const w = { startAt: at('2027-03-02T13:00:00Z'), endAt: at('2027-03-02T14:00:00Z') };
    const key = arrivalKey(visitKeyPrefix(1, '2027-03-02', 12, 7), w);
    expect(key).toBe(`arrival:1:2027-03-02:b12:o7:${w.startAt.getTime() / 60_000}-${w.endAt.getTime() / 60_000}`);
    expect(windowOfKey(key)).toEqual(w);
    expect(key.length).toBeLessThanOrEqual(191); // the column's width
  });
});
