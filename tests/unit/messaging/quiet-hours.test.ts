import { describe, expect, it } from 'vitest';
import { earliestSendAt, isQuietMinute, DEFAULT_QUIET_HOURS } from '../../../src/lib/messaging/quiet-hours.ts';

const NY = 'America/New_York';
const send = (iso: string) => earliestSendAt(new Date(iso), NY, DEFAULT_QUIET_HOURS).toISOString();

// Outside values: the 2026 America/New_York changes from the IANA tz database rules:
// 8 March 02:00 EST → 03:00 EDT (07:00Z), 1 November 02:00 EDT → 01:00 EST (06:00Z). Quiet hours
// 21:00–08:00 recipient time follow the TCPA calling-hours rule of thumb (from memory, [M]).
describe('quiet hours on the owner clock across the 2026 New York clock changes', () => {
  it('lets a text go at once between 08:00 and 21:00', () => {
    expect(send('2026-06-10T14:00:00Z')).toBe('2026-06-10T14:00:00.000Z'); // 10:00 EDT
    expect(send('2026-06-10T12:00:00Z')).toBe('2026-06-10T12:00:00.000Z'); // 08:00 EDT sharp
  });

  it('holds a 21:00 text until 08:00 the next morning', () => {
    // 21:00 EDT 10 June = 01:00Z 11 June → 08:00 EDT 11 June = 12:00Z
    expect(send('2026-06-11T01:00:00Z')).toBe('2026-06-11T12:00:00.000Z');
  });

  it('spring forward: a text at 21:30 EST on 7 March goes at 08:00 EDT on 8 March (12:00Z, not 13:00Z)', () => {
    // 21:30 EST = 02:30Z on 8 March; the next 08:00 is after the change, at UTC−4
    expect(send('2026-03-08T02:30:00Z')).toBe('2026-03-08T12:00:00.000Z');
    // 07:30 EDT on 8 March = 11:30Z: still quiet, goes half an hour later
    expect(send('2026-03-08T11:30:00Z')).toBe('2026-03-08T12:00:00.000Z');
    // 08:00 EST on 7 March was 13:00Z: the day before the change keeps UTC−5
    expect(send('2026-03-07T12:00:00Z')).toBe('2026-03-07T13:00:00.000Z');
  });

  it('fall back: both 01:30s of 1 November are quiet and go at 08:00 EST (13:00Z)', () => {
    // 01:30 EDT = 05:30Z and 01:30 EST = 06:30Z
    expect(send('2026-11-01T05:30:00Z')).toBe('2026-11-01T13:00:00.000Z');
    expect(send('2026-11-01T06:30:00Z')).toBe('2026-11-01T13:00:00.000Z');
    // 21:30 EDT on 31 October = 01:30Z 1 November → 08:00 EST = 13:00Z (the night is 11.5 h long)
    expect(send('2026-11-01T01:30:00Z')).toBe('2026-11-01T13:00:00.000Z');
    // 12:30Z on 1 November is 07:30 EST: quiet; at UTC−4 it would have been 08:30 and free
    expect(send('2026-11-01T12:30:00Z')).toBe('2026-11-01T13:00:00.000Z');
  });

  it('handles a quiet span that does not wrap past midnight', () => {
    expect(isQuietMinute(13 * 60, { startMinute: 12 * 60, endMinute: 14 * 60 })).toBe(true);
    expect(isQuietMinute(14 * 60, { startMinute: 12 * 60, endMinute: 14 * 60 })).toBe(false);
    expect(isQuietMinute(23 * 60, DEFAULT_QUIET_HOURS)).toBe(true);
    expect(isQuietMinute(7 * 60 + 59, DEFAULT_QUIET_HOURS)).toBe(true);
  });
});
