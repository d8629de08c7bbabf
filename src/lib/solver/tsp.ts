import { createRng } from './random';

/**
 * Single-vehicle tour engine: 2-opt and Or-opt (segments of 1–3, both orientations) with nearest-
 * neighbour candidate lists and don't-look bits, inside iterated local search with double-bridge
 * kicks (the classic Lin–Kernighan-style recipe, from memory: Johnson & McGeoch's survey of local
 * search for the TSP). Used by the TSPLIB benchmark; solve() does not call it (farrier days have
 * time windows and go through the routing search).
 */
export interface TspOptions {
  seed: number;
  maxIterations?: number;
  maxSeconds?: number;
  noImprovementIterations?: number;
  /** Known optimum: stop when reached (benchmarks only). */
  target?: number;
  neighbours?: number;
}

/** Best tour found (city indices), its length, and the run's iterations and seconds. */
export interface TspResult {
  tour: number[];
  length: number;
  iterations: number;
  seconds: number;
}

/** Length of a closed tour under a flat n × n distance matrix. */
export function tourLength(dist: ArrayLike<number>, n: number, tour: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < tour.length; i++) s += dist[tour[i] * n + tour[(i + 1) % tour.length]];
  return s;
}

/** Searches for a short closed tour through all n cities; deterministic for a seed and iteration limit. */
export function solveTsp(dist: ArrayLike<number>, n: number, opts: TspOptions): TspResult {
  const t0 = performance.now() / 1000;
  if (n <= 3) {
    const tour = Array.from({ length: n }, (_, i) => i);
    return { tour, length: tourLength(dist, n, tour), iterations: 0, seconds: 0 };
  }
  const rng = createRng(opts.seed);
  const K = Math.min(opts.neighbours ?? 10, n - 1);
  const D = (a: number, b: number) => dist[a * n + b];
  const nb: Int32Array[] = [];
  for (let a = 0; a < n; a++) {
    const o = Array.from({ length: n }, (_, i) => i).filter((b) => b !== a);
    o.sort((x, y) => D(a, x) - D(a, y) || x - y);
    nb.push(Int32Array.from(o.slice(0, K)));
  }
  // nearest-neighbour start
  let tour = new Int32Array(n);
  {
    const used = new Uint8Array(n);
    let c = rng.int(n);
    for (let i = 0; i < n; i++) {
      tour[i] = c; used[c] = 1;
      let bn = -1, bd = Infinity;
      for (const x of nb[c]) if (!used[x] && D(c, x) < bd) { bd = D(c, x); bn = x; }
      if (bn < 0) for (let x = 0; x < n; x++) if (!used[x] && D(c, x) < bd) { bd = D(c, x); bn = x; }
      c = bn;
    }
  }
  const pos = new Int32Array(n);
  const setPos = () => { for (let i = 0; i < n; i++) pos[tour[i]] = i; };
  setPos();
  const succ = (c: number) => tour[pos[c] + 1 === n ? 0 : pos[c] + 1];
  const pred = (c: number) => tour[pos[c] === 0 ? n - 1 : pos[c] - 1];
  /** Reverses the path from city a to city b (following successors), or its complement if shorter. */
  const reversePath = (a: number, b: number) => {
    let i = pos[a], j = pos[b];
    let len = j - i; if (len < 0) len += n; len += 1;
    if (2 * len > n) { const ni = j + 1 === n ? 0 : j + 1, nj = i === 0 ? n - 1 : i - 1; i = ni; j = nj; len = n - len; }
    for (let k = 0; k < Math.floor(len / 2); k++) {
      const ci = tour[i], cj = tour[j];
      tour[i] = cj; pos[cj] = i; tour[j] = ci; pos[ci] = j;
      i = i + 1 === n ? 0 : i + 1; j = j === 0 ? n - 1 : j - 1;
    }
  };
  const dontLook = new Uint8Array(n);
  const queue: number[] = [];
  const push = (c: number) => { if (dontLook[c]) { dontLook[c] = 0; queue.push(c); } };

  const improveCity = (a: number): boolean => {
    // 2-opt, successor and predecessor directions
    for (let dir = 0; dir < 2; dir++) {
      const b = dir === 0 ? succ(a) : pred(a);
      const dab = D(a, b);
      for (const c of nb[a]) {
        const g1 = dab - D(a, c);
        if (g1 <= 0) break;
        const d = dir === 0 ? succ(c) : pred(c);
        if (c === b || d === a) continue;
        const gain = g1 + D(c, d) - D(b, d);
        if (gain > 1e-9) {
          if (dir === 0) reversePath(b, c); else reversePath(c, b);
          push(a); push(b); push(c); push(d);
          return true;
        }
      }
    }
    // Or-opt: move the segment starting at a (length 1..3, going forward) next to a neighbour
    for (let L = 1; L <= 3; L++) {
      const s1 = a;
      let s2 = a;
      for (let k = 1; k < L; k++) s2 = succ(s2);
      const p0 = pred(s1), n0 = succ(s2);
      if (n0 === p0 || n0 === s1) break;
      const removeGain = D(p0, s1) + D(s2, n0) - D(p0, n0);
      if (removeGain <= 1e-9) continue;
      for (const end of [s1, s2]) {
        for (const c of nb[end]) {
          // c must be outside the segment
          let inSeg = false, x = s1;
          for (let k = 0; k < L; k++) { if (x === c) inSeg = true; x = succ(x); }
          if (inSeg) continue;
          for (const d of [succ(c), pred(c)]) {
            let inSeg2 = false; x = s1;
            for (let k = 0; k < L; k++) { if (x === d) inSeg2 = true; x = succ(x); }
            if (inSeg2) continue;
            // insert between c and d with `end` adjacent to c
            const other = end === s1 ? s2 : s1;
            const addCost = D(c, end) + D(other, d) - D(c, d);
            if (removeGain - addCost > 1e-9) {
              const seg: number[] = [];
              x = s1;
              for (let k = 0; k < L; k++) { seg.push(x); x = succ(x); }
              const rest: number[] = [];
              x = n0;
              for (let k = 0; k < n - L; k++) { rest.push(x); x = succ(x); }
              // place: ... c, [end ... other], d ... (or d, [other ... end], c)
              const ci = rest.indexOf(c), di = rest.indexOf(d);
              const oriented = end === s1 ? seg : seg.slice().reverse();
              let out: number[];
              if ((ci + 1) % rest.length === di) out = [...rest.slice(0, ci + 1), ...oriented, ...rest.slice(ci + 1)];
              else out = [...rest.slice(0, di + 1), ...oriented.slice().reverse(), ...rest.slice(di + 1)];
              tour = Int32Array.from(out);
              setPos();
              push(p0); push(n0); push(s1); push(s2); push(c); push(d);
              return true;
            }
          }
        }
      }
    }
    return false;
  };
  const localSearch = () => {
    while (queue.length) {
      const a = queue.pop()!;
      dontLook[a] = 1;
      improveCity(a);
    }
  };
  for (let c = n - 1; c >= 0; c--) queue.push(c);
  localSearch();
  let cur = tourLength(dist, n, tour);
  let best = cur, bestTour = tour.slice();
  let iterations = 0, since = 0;
  const maxIt = opts.maxIterations ?? Infinity;
  const maxSec = opts.maxSeconds ?? (opts.maxIterations === undefined ? 5 : Infinity);
  // stop early after a long stall (default 20,000 kicks without a shorter tour)
  const noImp = opts.noImprovementIterations ?? 20000;
  while (iterations < maxIt && since < noImp && !(opts.target !== undefined && best <= opts.target)) {
    if ((iterations & 15) === 0 && performance.now() / 1000 - t0 >= maxSec) break;
    iterations++; since++;
    // double bridge on a local window: A B C D -> A C B D
    const saved = tour.slice();
    const w = Math.min(n - 1, 30 + rng.int(Math.max(1, Math.min(70, n - 30))));
    const start = rng.int(n);
    const rot: number[] = [];
    for (let k = 0; k < n; k++) rot.push(tour[(start + k) % n]);
    const cuts = [1 + rng.int(w - 2), 1 + rng.int(w - 2), 1 + rng.int(w - 2)].sort((x, y) => x - y);
    if (cuts[0] === cuts[1] || cuts[1] === cuts[2]) { continue; }
    const [p1, p2, p3] = cuts;
    const nt = [...rot.slice(0, p1), ...rot.slice(p2, p3), ...rot.slice(p1, p2), ...rot.slice(p3)];
    tour = Int32Array.from(nt);
    setPos();
    for (const i of [0, p1 - 1, p1, p2 - 1, p2, p3 - 1, p3 % n, n - 1]) push(rot[i]);
    for (const i of [p1 - 1, p1, p2 - 1, p2, p3 - 1, p3 % n]) for (const x of nb[rot[i]].slice(0, 3)) push(x);
    localSearch();
    const len = tourLength(dist, n, tour);
    if (len < best - 1e-9) { best = len; bestTour = tour.slice(); since = 0; }
    if (len <= cur + 1e-9) cur = len;
    else { tour = saved; setPos(); }
  }
  return { tour: Array.from(bestTour), length: best, iterations, seconds: performance.now() / 1000 - t0 };
}
