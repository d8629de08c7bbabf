import { describe, expect, it } from 'vitest';
import { createProblem } from '../../../src/lib/solver/problem';
import { evaluateRoutes } from '../../../src/lib/solver/checker';

const H = 3600;
/*
 * Two farriers (f1 qualified with a forge, f2 an apprentice with neither), home at 0; barn b1 at
 * location 1 (20 min away, open 07:00–18:00), barn b2 at location 2 (30 min away, open 09:00–10:00).
 * Shifts 08:00–16:00, 8 h normal work, no overtime allowed.
 */
const p = createProblem({
  locations: 3,
  durationSec: [[0, 1200, 1800], [1200, 0, 900], [1800, 900, 0]],
  distanceM: [[0, 20000, 30000], [20000, 0, 15000], [30000, 15000, 0]],
  farriers: [
    { id: 'f1', startLocation: 0, endLocation: 0, shiftStartSec: 8 * H, shiftEndSec: 16 * H, normalWorkSec: 8 * H, qualified: true, hasForge: true },
    { id: 'f2', startLocation: 0, endLocation: 0, shiftStartSec: 8 * H, shiftEndSec: 16 * H, normalWorkSec: 8 * H, qualified: false, hasForge: false },
  ],
  barns: [
    { id: 'b1', location: 1, windows: [{ startSec: 7 * H, endSec: 18 * H }], setupSec: 600 },
    { id: 'b2', location: 2, windows: [{ startSec: 9 * H, endSec: 10 * H }], setupSec: 600 },
  ],
  jobs: [
    { id: 'hot', barnId: 'b1', durationSec: 3600, needsForge: true },
    { id: 'bar', barnId: 'b1', durationSec: 5400, needsQualified: true },
    { id: 'trim', barnId: 'b2', durationSec: 1500 },
    { id: 'mine', barnId: 'b1', durationSec: 1500, pin: { farrierId: 'f1', position: 1 } },
  ],
});

describe('evaluateRoutes after a dispatcher moves jobs', () => {
  it('re-times a valid edit without violations, with the hand-computed times', () => {
    // f2: home → b2 takes 30 min; set-up may start when the barn opens at 09:00, work 09:10–09:35.
    const r = evaluateRoutes(p, [{ farrierId: 'f2', jobIds: ['trim'] }, { farrierId: 'f1', jobIds: ['mine', 'hot', 'bar'] }]);
    expect(r.violations).toEqual([]);
    const trim = r.routes[0].stops[0];
    expect(trim).toMatchObject({ startSec: 9 * H, departureSec: 9 * H + 600 + 1500 });
    // f2 leaves home as late as possible: 09:00 − 30 min = 08:30
    expect(r.routes[0].startSec).toBe(8.5 * H);
  });

  it('names each broken rule with a code and a plain message instead of fixing it', () => {
    const r = evaluateRoutes(p, [
      // f2 at b1 08:30–11:25 (hot 1 h, bar 1.5 h, mine 25 min), then b2 at 11:40: that barn closed at 10:00
      { farrierId: 'f2', jobIds: ['hot', 'bar', 'mine', 'trim'] },
      { farrierId: 'f1', jobIds: ['hot'] },
    ]);
    const codes = r.violations.map((v) => v.code);
    expect(codes).toEqual(expect.arrayContaining(['no_forge', 'not_qualified', 'pinned_elsewhere', 'job_repeated', 'window_missed']));
    expect(r.feasible).toBe(false);
    const forge = r.violations.find((v) => v.code === 'no_forge')!;
    expect(forge).toMatchObject({ farrierId: 'f2', jobId: 'hot' });
    expect(forge.message).toMatch(/forge/);
  });

  it('reports a pin position, an unknown farrier and a day that runs past the shift', () => {
    const r = evaluateRoutes(p, [
      // 'mine' is pinned to stop 1 but comes after the stop at b2
      { farrierId: 'f1', jobIds: ['trim', 'mine'] },
      { farrierId: 'zed', jobIds: ['trim'] },
    ]);
    const codes = r.violations.map((v) => v.code);
    expect(codes).toContain('pin_position');
    expect(codes).toContain('unknown_farrier');
    const long = createProblem({ ...p, jobs: [{ id: 'long', barnId: 'b1', durationSec: 8 * H }] });
    // 20 min + 10 min set-up + 8 h + 20 min = 8 h 50 min > 8 h with no overtime allowed
    expect(evaluateRoutes(long, [{ farrierId: 'f1', jobIds: ['long'] }]).violations.map((v) => v.code)).toEqual(expect.arrayContaining(['overtime_exceeded', 'shift_end_exceeded']));
  });
});
