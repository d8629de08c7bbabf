import solver from 'javascript-lp-solver';
import { describe, expect, it } from 'vitest';
import { packColumns, type PackColumns } from '../../../src/lib/solver/pack';
import { createRng } from '../../../src/lib/solver/random';

interface Instance { nItems: number; nGroups: number; cols: { g: number; items: number[]; v: number }[]; must: Uint8Array }

function randomInstance(seed: number): Instance {
  const rng = createRng(seed);
  const nItems = 8 + rng.int(5), nGroups = 3;
  const cols: Instance['cols'] = [];
  for (let g = 0; g < nGroups; g++) for (let k = 6 + rng.int(8); k > 0; k--) {
    const items = new Set<number>();
    for (let t = 1 + rng.int(4); t > 0; t--) items.add(rng.int(nItems));
    cols.push({ g, items: [...items], v: Math.round(rng.next() * 120 - 20) });
  }
  const must = new Uint8Array(nItems);
  if (seed % 3 === 0) for (const j of cols[rng.int(cols.length)].items) must[j] = 1;
  return { nItems, nGroups, cols, must };
}

function flat(x: Instance): PackColumns {
  const start = new Int32Array(x.cols.length + 1);
  x.cols.forEach((c, k) => { start[k + 1] = start[k] + c.items.length; });
  return { start, items: Int32Array.from(x.cols.flatMap((c) => c.items)), group: Int32Array.from(x.cols.map((c) => c.g)), value: Float64Array.from(x.cols.map((c) => c.v)) };
}

/** Whether a choice of columns is a packing: one per group at most, no item twice, every `must` item once. */
function valid(x: Instance, chosen: number[]): boolean {
  const groups = new Set<number>(), seen = new Set<number>();
  for (const k of chosen) {
    if (groups.has(x.cols[k].g)) return false;
    groups.add(x.cols[k].g);
    for (const j of x.cols[k].items) { if (seen.has(j)) return false; seen.add(j); }
  }
  for (let j = 0; j < x.nItems; j++) if (x.must[j] && !seen.has(j)) return false;
  return true;
}

/** Best packing value by trying every choice (each group: none or one of its columns); -Infinity when none is valid. */
function enumerate(x: Instance): number {
  const byGroup = Array.from({ length: x.nGroups }, (_, g) => [-1, ...x.cols.flatMap((c, k) => (c.g === g ? [k] : []))]);
  let best = -Infinity;
  const go = (g: number, chosen: number[]) => {
    if (g === x.nGroups) {
      const ks = chosen.filter((k) => k >= 0);
      if (valid(x, ks)) best = Math.max(best, ks.reduce((a, k) => a + x.cols[k].v, 0));
      return;
    }
    for (const k of byGroup[g]) go(g + 1, [...chosen, k]);
  };
  go(0, []);
  return best;
}

/** The same optimum from javascript-lp-solver (a general-purpose MIP library from npm). */
function lpValue(x: Instance): number {
  const constraints: Record<string, { equal?: number; max?: number }> = {};
  for (let j = 0; j < x.nItems; j++) constraints[`i${j}`] = x.must[j] ? { equal: 1 } : { max: 1 };
  for (let g = 0; g < x.nGroups; g++) constraints[`g${g}`] = { max: 1 };
  const variables: Record<string, Record<string, number>> = {}, ints: Record<string, 1> = {};
  x.cols.forEach((c, k) => {
    const v: Record<string, number> = { value: c.v, [`g${c.g}`]: 1 };
    for (const j of c.items) v[`i${j}`] = 1;
    variables[`c${k}`] = v;
    ints[`c${k}`] = 1;
  });
  const res = solver.Solve({ optimize: 'value', opType: 'max', constraints, variables, ints }) as { feasible: boolean; result: number };
  return res.feasible ? res.result : -Infinity;
}

describe('route packing (packColumns)', () => {
  it('finds the best packing, as enumeration and javascript-lp-solver do, on random small instances', () => {
    let compared = 0, withMust = 0;
    for (let seed = 1; seed <= 30; seed++) {
      const x = randomInstance(seed);
      const opt = enumerate(x);
      expect(lpValue(x)).toBeCloseTo(opt, 6);
      if (opt === -Infinity) continue;
      const res = packColumns(x.nItems, x.nGroups, flat(x), x.must, opt - 1, { nodeLimit: 1e6 });
      expect(res.complete).toBe(true);
      expect(res.chosen).not.toBeNull();
      expect(valid(x, res.chosen!)).toBe(true);
      expect(res.value).toBeCloseTo(opt, 6);
      expect(res.chosen!.reduce((a, k) => a + x.cols[k].v, 0)).toBeCloseTo(opt, 6);
      expect(res.bound).toBeGreaterThanOrEqual(opt - 1e-6);
      // nothing beats the optimum itself
      expect(packColumns(x.nItems, x.nGroups, flat(x), x.must, opt, { nodeLimit: 1e6 }).chosen).toBeNull();
      compared++;
      if (x.must.some((b) => b)) withMust++;
    }
    expect(compared).toBeGreaterThan(20);
    expect(withMust).toBeGreaterThan(5);
  });

  it('returns a valid packing or none when its node limit stops the search early', () => {
    let cut = 0;
    for (let seed = 40; seed < 60; seed++) {
      const x = randomInstance(seed);
      const res = packColumns(x.nItems, x.nGroups, flat(x), x.must, -1e9, { nodeLimit: 3, priceSteps: 5 });
      if (!res.complete) cut++;
      if (res.chosen) expect(valid(x, res.chosen)).toBe(true);
    }
    expect(cut).toBeGreaterThan(0);
  });
});
