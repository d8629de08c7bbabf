/**
 * Exact route packing for a day whose farriers differ: from columns (one farrier's route each, with
 * a value), choose at most one column per farrier so that no job is in two chosen columns, every
 * job in `must` is in exactly one, and the total value is as high as possible.
 *
 * Bound: Lagrangian relaxation of the job rows (a price per job; each farrier then takes its column
 * of highest value minus prices, or none), prices set by subgradient steps (Held, Wolfe and Crowder's
 * rule, from memory). Search: depth first over farriers, each farrier's columns in order of value
 * minus prices, cut off when the bound cannot beat the best packing found. The answer is exact when
 * the search ends within its node limit; otherwise it is the best packing found, which is still a
 * valid packing. Deterministic for given columns and limits unless a deadline is given.
 */

/** Columns in flat arrays: column k covers items[start[k]..start[k+1]), belongs to group[k], has value[k]. */
export interface PackColumns {
  start: Int32Array;
  items: Int32Array;
  group: Int32Array;
  value: Float64Array;
}

export interface PackLimits {
  /** Subgradient steps at most (default 50). */
  priceSteps?: number;
  /** Search nodes at most (default 20,000). */
  nodeLimit?: number;
  /** performance.now() in ms after which the search returns what it has. */
  deadlineMs?: number;
  /** Prices to start from (per item), e.g. the last call's; changed in place to the prices used. */
  prices?: Float64Array;
}

export interface PackResult {
  /** Chosen columns, or null when none beats `beatValue`. */
  chosen: number[] | null;
  value: number;
  /** Upper bound on the best packing's value (Lagrangian). */
  bound: number;
  nodes: number;
  /** True when the search ended within its limits, so `chosen` is optimal (or nothing beats `beatValue`). */
  complete: boolean;
}

/**
 * Best packing with value above `beatValue` (pass the incumbent's value so that only a strictly
 * better packing comes back).
 */
export function packColumns(nItems: number, nGroups: number, c: PackColumns, must: Uint8Array, beatValue: number, limits: PackLimits = {}): PackResult {
  const { start, items, group, value } = c;
  const nc = group.length;
  const deadline = limits.deadlineMs ?? Infinity;
  const price = limits.prices && limits.prices.length === nItems ? limits.prices : new Float64Array(nItems);
  for (let j = 0; j < nItems; j++) if (!must[j] && !(price[j] > 0)) price[j] = 0;
  const reduced = new Float64Array(nc);
  const bestR = new Float64Array(nGroups), bestK = new Int32Array(nGroups);
  const cover = new Float64Array(nItems);
  let bound = Infinity;
  let boundPrice = price.slice();
  let step = 2, stale = 0;
  const maxSteps = limits.priceSteps ?? 50;
  for (let it = 0; it < maxSteps; it++) {
    let L = 0;
    for (let j = 0; j < nItems; j++) L += price[j];
    bestR.fill(0); bestK.fill(-1);
    for (let k = 0; k < nc; k++) {
      let r = value[k];
      const e = start[k + 1];
      for (let q = start[k]; q < e; q++) r -= price[items[q]];
      const g = group[k];
      if (r > bestR[g]) { bestR[g] = r; bestK[g] = k; }
    }
    cover.fill(0);
    for (let g = 0; g < nGroups; g++) {
      L += bestR[g];
      const k = bestK[g];
      if (k >= 0) for (let q = start[k]; q < start[k + 1]; q++) cover[items[q]]++;
    }
    if (L < bound - 1e-9 * Math.max(1, Math.abs(L))) { bound = L; boundPrice = price.slice(); stale = 0; }
    else if (++stale >= 8) { step /= 2; stale = 0; }
    const gap = L - beatValue;
    if (gap <= 0 || step < 0.01 || performance.now() > deadline) break;
    let norm = 0;
    for (let j = 0; j < nItems; j++) {
      const s = 1 - cover[j];
      if (!(s > 0 && price[j] <= 0 && !must[j])) norm += s * s;
    }
    if (norm === 0) break;
    const mu = (step * gap) / norm;
    for (let j = 0; j < nItems; j++) {
      const v = price[j] - mu * (1 - cover[j]);
      price[j] = must[j] || v > 0 ? v : 0;
    }
  }
  price.set(boundPrice);
  if (bound <= beatValue) return { chosen: null, value: beatValue, bound, nodes: 0, complete: true };

  for (let k = 0; k < nc; k++) {
    let r = value[k];
    for (let q = start[k]; q < start[k + 1]; q++) r -= price[items[q]];
    reduced[k] = r;
  }
  // each group's columns, highest reduced value first
  const byGroup: Int32Array[] = [];
  {
    const lists: number[][] = Array.from({ length: nGroups }, () => []);
    for (let k = 0; k < nc; k++) lists[group[k]].push(k);
    for (const l of lists) { l.sort((a, b) => reduced[b] - reduced[a] || a - b); byGroup.push(Int32Array.from(l)); }
  }
  // groups with the most columns first: their choice settles the most
  const order = Array.from({ length: nGroups }, (_, g) => g).sort((a, b) => byGroup[b].length - byGroup[a].length || a - b);
  const used = new Uint8Array(nItems);
  let mustLeft = 0;
  for (let j = 0; j < nItems; j++) if (must[j]) mustLeft++;
  let bestValue = beatValue;
  let chosen: number[] | null = null;
  const picked: number[] = [];
  const terms = new Float64Array(nGroups);
  const limit = limits.nodeLimit ?? 20000;
  let nodes = 0, stopped = false;
  const eps = 1e-9 * Math.max(1, Math.abs(beatValue));
  const fits = (k: number) => {
    for (let q = start[k]; q < start[k + 1]; q++) if (used[items[q]]) return false;
    return true;
  };
  const bestTerm = (g: number) => {
    const l = byGroup[g];
    for (let i = 0; i < l.length; i++) {
      const k = l[i];
      if (reduced[k] <= 0) return 0;
      if (fits(k)) return reduced[k];
    }
    return 0;
  };
  const dfs = (depth: number, v: number, freePrice: number, mustOpen: number): void => {
    if (stopped) return;
    if (++nodes > limit || ((nodes & 255) === 0 && performance.now() > deadline)) { stopped = true; return; }
    if (depth === nGroups) {
      if (mustOpen === 0 && v > bestValue + eps) { bestValue = v; chosen = picked.slice(); }
      return;
    }
    let rest = 0;
    for (let d = depth; d < nGroups; d++) { terms[d] = bestTerm(order[d]); rest += terms[d]; }
    const ub = v + freePrice + rest;
    if (ub <= bestValue + eps) return;
    const g = order[depth], l = byGroup[g];
    const base = ub - terms[depth];
    for (let i = 0; i < l.length; i++) {
      const k = l[i];
      if (base + reduced[k] <= bestValue + eps) break;
      if (!fits(k)) continue;
      let paid = 0, closes = 0;
      for (let q = start[k]; q < start[k + 1]; q++) { const j = items[q]; used[j] = 1; paid += price[j]; if (must[j]) closes++; }
      picked.push(k);
      dfs(depth + 1, v + value[k], freePrice - paid, mustOpen - closes);
      picked.pop();
      for (let q = start[k]; q < start[k + 1]; q++) used[items[q]] = 0;
      if (stopped) return;
    }
    if (base > bestValue + eps) dfs(depth + 1, v, freePrice, mustOpen);
  };
  let free0 = 0;
  for (let j = 0; j < nItems; j++) free0 += price[j];
  dfs(0, 0, free0, mustLeft);
  return { chosen, value: bestValue, bound, nodes, complete: !stopped };
}
