import { describe, expect, it } from 'vitest';
import { reestimate } from '../../../src/lib/day-sheet/reestimate.ts';

const min = 60_000;
// Three stops planned at 08:00–09:00, 09:30–10:30 (30 min gap), 11:00–11:45 (30 min gap), in ms from 0.
const planned = [
  { id: 1, arrivalMs: 480 * min, startMs: 490 * min, departureMs: 540 * min },
  { id: 2, arrivalMs: 570 * min, startMs: 580 * min, departureMs: 630 * min },
  { id: 3, arrivalMs: 660 * min, startMs: 670 * min, departureMs: 705 * min },
];

// The model is our own (no outside source): planned gaps kept, the latest actual time shifts the rest.
describe('re-estimating the stops ahead from actual times', () => {
  it('keeps the plan when nothing is marked', () => {
    const est = reestimate(planned, new Map());
    expect(est.map((e) => e.basis)).toEqual(['plan', 'plan', 'plan']);
    expect(est.map((e) => e.delaySec)).toEqual([0, 0, 0]);
  });

  it('shifts later stops by the lateness of a done stop', () => {
    // stop 1 done at 09:20 (20 min later than 09:00) → stop 2 at 09:20 + 30 = 09:50 (20 late),
    // leaves 09:50 + 60 = 10:50, stop 3 at 10:50 + 30 = 11:20 (20 late)
    const est = reestimate(planned, new Map([[1, { state: 'done', arrivedMs: 485 * min, departedMs: 560 * min }]]));
    expect(est[1]).toMatchObject({ arrivalMs: 590 * min, delaySec: 20 * 60, basis: 'estimate' });
    expect(est[2]).toMatchObject({ arrivalMs: 680 * min, delaySec: 20 * 60 });
  });

  it('moves later stops earlier when a stop is skipped quickly', () => {
    // stop 1 skipped: arrived 08:00, left 08:10 → stop 2 at 08:40 (50 min early)
    const est = reestimate(planned, new Map([[1, { state: 'skipped', arrivedMs: 480 * min, departedMs: 490 * min }]]));
    expect(est[1]!.delaySec).toBe(-50 * 60);
  });

  it('uses the arrival plus the planned work for a stop that is only arrived', () => {
    // arrived 08:15, planned arrival-to-departure 60 min → leaves 09:15, stop 2 at 09:45 (15 late)
    const est = reestimate(planned, new Map([[1, { state: 'arrived', arrivedMs: 495 * min, departedMs: null }]]));
    expect(est[0]!.departureMs).toBe(555 * min);
    expect(est[1]!.delaySec).toBe(15 * 60);
  });
});
