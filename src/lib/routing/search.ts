/**
 * One-to-many Dijkstra over the graph's integer arc durations, from seeds placed part-way along pieces.
 * The workspace is allocated once per graph and reused (a run stamp replaces clearing), which keeps a
 * 100 × 100 matrix to a few milliseconds per source.
 */
import { MinHeap } from './heap';
import type { RoadGraph } from './graph';

/** A start: reach `node` having already spent `costMs` and driven `distMm`. */
export interface Seed {
  node: number;
  costMs: number;
  distMm: number;
}

export interface SearchSpace {
  readonly costMs: Float64Array;
  readonly distMm: Float64Array;
  /** Arc used to reach each node, -1 at seeds. */
  readonly predArc: Int32Array;
  /** Index of the seed each node's path starts from. */
  readonly seedOf: Int32Array;
  readonly reachedStamp: Uint32Array;
  readonly settledStamp: Uint32Array;
  readonly targetStamp: Uint32Array;
  run: number;
  readonly heap: MinHeap;
}

const spaces = new WeakMap<RoadGraph, SearchSpace>();

function spaceFor(graph: RoadGraph): SearchSpace {
  let s = spaces.get(graph);
  if (!s) {
    const n = graph.nodeCount;
    s = {
      costMs: new Float64Array(n),
      distMm: new Float64Array(n),
      predArc: new Int32Array(n),
      seedOf: new Int32Array(n),
      reachedStamp: new Uint32Array(n),
      settledStamp: new Uint32Array(n),
      targetStamp: new Uint32Array(n),
      run: 0,
      heap: new MinHeap(),
    };
    spaces.set(graph, s);
  }
  return s;
}

/**
 * Runs Dijkstra from the seeds until every target node is settled (or the reachable graph is exhausted).
 * Read results with {@link reached}; they stay valid until the next search on the same graph.
 */
export function searchFrom(graph: RoadGraph, seeds: readonly Seed[], targets?: ArrayLike<number>): SearchSpace {
  const s = spaceFor(graph);
  s.run = (s.run + 1) >>> 0 || 1;
  const run = s.run;
  const { costMs, distMm, predArc, seedOf, reachedStamp, settledStamp, targetStamp, heap } = s;
  const { arcStart, arcTarget, arcDurationMs, arcDistanceMm } = graph;
  heap.clear();
  let remaining = -1;
  if (targets) {
    remaining = 0;
    for (let i = 0; i < targets.length; i++) {
      const t = targets[i]!;
      if (targetStamp[t] !== run) {
        targetStamp[t] = run;
        remaining++;
      }
    }
  }
  seeds.forEach((seed, i) => {
    const n = seed.node;
    if (reachedStamp[n] !== run || seed.costMs < costMs[n]!) {
      reachedStamp[n] = run;
      costMs[n] = seed.costMs;
      distMm[n] = seed.distMm;
      predArc[n] = -1;
      seedOf[n] = i;
      heap.push(n, seed.costMs);
    }
  });
  while (heap.size > 0) {
    const key = heap.peekKey();
    const v = heap.pop();
    if (settledStamp[v] === run || key > costMs[v]!) continue;
    settledStamp[v] = run;
    if (remaining > 0 && targetStamp[v] === run && --remaining === 0) break;
    const cv = costMs[v]!;
    const dv = distMm[v]!;
    for (let a = arcStart[v]!, end = arcStart[v + 1]!; a < end; a++) {
      const w = arcTarget[a]!;
      if (settledStamp[w] === run) continue;
      const c = cv + arcDurationMs[a]!;
      if (reachedStamp[w] !== run || c < costMs[w]!) {
        reachedStamp[w] = run;
        costMs[w] = c;
        distMm[w] = dv + arcDistanceMm[a]!;
        predArc[w] = a;
        seedOf[w] = seedOf[v]!;
        heap.push(w, c);
      }
    }
  }
  return s;
}

/** Whether the last search reached node n (its costMs/distMm are then final once settled). */
export function reached(s: SearchSpace, n: number): boolean {
  return s.settledStamp[n] === s.run;
}
