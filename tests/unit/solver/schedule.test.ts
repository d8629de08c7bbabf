import { describe, expect, it } from 'vitest';
import { nextCycle } from '../../../src/lib/solver/solve';

/** The cycle lengths a run with `budget` iterations goes through (60 jobs: first 600, at most 12,000). */
function cycles(budget: number, first = 600, max = 12000): number[] {
  const out: number[] = [];
  let done = 0, c = nextCycle(first / 2, max, budget);
  while (done < budget) {
    out.push(c);
    done += c;
    c = nextCycle(c, max, budget - done);
  }
  return out;
}

describe('annealing cycles', () => {
  it('double from the first length up to the longest', () => {
    expect(cycles(1_000_000).slice(0, 7)).toEqual([600, 1200, 2400, 4800, 9600, 12000, 12000]);
  });

  it('end with the run: the last cycle is cut to the iterations left, so it cools all the way down', () => {
    // 25,000 iterations (about 3 s of one search on a 60-job day): 600 + … + 9,600 = 18,600, then 6,400
    expect(cycles(25_000)).toEqual([600, 1200, 2400, 4800, 9600, 6400]);
    const long = cycles(500_000);
    expect(long.reduce((a, b) => a + b, 0)).toBe(500_000);
    expect(long[long.length - 1]).toBe(500_000 - 18_600 - 12_000 * Math.floor((500_000 - 18_600) / 12_000));
  });

  it('fit a budget shorter than the first cycle', () => {
    expect(cycles(200)).toEqual([200]);
    expect(nextCycle(300, 12000, 0)).toBe(1);
  });
});
