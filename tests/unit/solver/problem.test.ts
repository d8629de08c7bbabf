import { describe, expect, it } from 'vitest';
import { createProblem, ProblemError, problemSchema } from '../../../src/lib/solver/problem';

const valid = () => ({
  locations: 2,
  durationSec: [[0, 600], [600, 0]],
  distanceM: [[0, 9000], [9000, 0]],
  farriers: [{ id: 'f1', startLocation: 0, endLocation: 0, shiftStartSec: 25200, shiftEndSec: 61200, normalWorkSec: 30600, qualified: true, hasForge: true }],
  barns: [{ id: 'b1', location: 1, windows: [{ startSec: 25200, endSec: 64800 }], setupSec: 600 }],
  jobs: [{ id: 'j1', barnId: 'b1', durationSec: 2700 }],
});

function issuesOf(input: unknown) {
  try { createProblem(input); } catch (e) {
    expect(e).toBeInstanceOf(ProblemError);
    return (e as ProblemError).issues;
  }
  throw new Error('expected a ProblemError');
}

describe('createProblem validation', () => {
  it('accepts a valid problem, fills documented defaults and freezes it deeply', () => {
    const p = createProblem(valid());
    expect(p.windowMode).toBe('service-inside');
    expect(p.objective).toBe('weighted');
    expect(p.jobs[0]).toMatchObject({ priority: 1, optional: false, penalty: 0, needsForge: false, needsQualified: false });
    expect(Object.isFrozen(p)).toBe(true);
    expect(Object.isFrozen(p.farriers[0])).toBe(true);
    expect(() => { (p.jobs as unknown as unknown[]).push({}); }).toThrow();
    expect(problemSchema.safeParse(valid()).success).toBe(true);
  });

  it('rejects a matrix of the wrong size with the row path', () => {
    const input = valid();
    input.durationSec = [[0, 600], [600]];
    expect(issuesOf(input)).toContainEqual({ path: 'durationSec.1', message: 'needs 2 columns, has 1' });
  });

  it('rejects unknown barns, out-of-range locations and duplicate ids, listing all of them', () => {
    const input = valid() as ReturnType<typeof valid> & { jobs: { id: string; barnId: string; durationSec: number }[] };
    input.jobs.push({ id: 'j1', barnId: 'nowhere', durationSec: 60 });
    input.barns[0].location = 5;
    const paths = issuesOf(input).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['jobs.1.id', 'jobs.1.barnId', 'barns.0.location']));
  });

  it('rejects non-integer seconds, negative durations and reversed windows', () => {
    const input = valid();
    input.jobs[0].durationSec = -5;
    input.farriers[0].shiftStartSec = 25200.5;
    input.barns[0].windows = [{ startSec: 50000, endSec: 40000 }];
    const paths = issuesOf(input).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['jobs.0.durationSec', 'farriers.0.shiftStartSec', 'barns.0.windows.0']));
  });

  it('rejects a break without a break window and a shift that ends before it starts', () => {
    const input = valid() as ReturnType<typeof valid> & { farriers: Record<string, unknown>[] };
    Object.assign(input.farriers[0], { breakSec: 1800, shiftEndSec: 20000 });
    const paths = issuesOf(input).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['farriers.0.breakWindow', 'farriers.0.shiftEndSec']));
  });

  it('rejects input that is not an object at all with a ProblemError, not a crash', () => {
    expect(issuesOf(null).length).toBeGreaterThan(0);
    expect(issuesOf('a day').length).toBeGreaterThan(0);
    expect(issuesOf({}).map((i) => i.path)).toEqual(expect.arrayContaining(['locations', 'farriers', 'jobs']));
  });
});
