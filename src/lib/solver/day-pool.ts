import type { Model } from './model';
import { packColumns, type PackLimits } from './pack';
import { createRng } from './random';
import type { State } from './state';

interface Column { farrier: number; seq: number[]; cost: number }

/**
 * Routes the search has met on a day whose farriers differ (home, skills, forge, shift), kept per
 * farrier as the cheapest order of each set of jobs, and recombined into the best plan they can
 * make together (`recombine`): one route per farrier at most, no job twice, every mandatory job the
 * incumbent plans planned again. A short search meets the routes of a better plan in different
 * steps more often than it puts them together in one (on the invented days the long run's routes
 * were, as job sets, among those a 25,000-iteration run had met, on most days and farriers).
 */
export class DayRoutePool {
  private readonly sets: Map<number, Column>[];
  private readonly hashA: Int32Array;
  private readonly hashB: Int32Array;
  private count = 0;
  /** Job prices of the last packing, the next one's starting point. */
  private prices: Float64Array;

  constructor(readonly m: Model, readonly maxSize = 60000) {
    this.sets = Array.from({ length: m.nFarriers }, () => new Map());
    // a job set's key: two 26-bit XOR hashes of its jobs, one exact integer (a collision only loses a column)
    const rng = createRng(0x5eed);
    this.hashA = Int32Array.from({ length: m.nJobs }, () => rng.int(1 << 26));
    this.hashB = Int32Array.from({ length: m.nJobs }, () => rng.int(1 << 26));
    this.prices = new Float64Array(m.nJobs);
  }

  get size(): number { return this.count; }

  /** Routes added since the last `shareTo`, when this search shares its routes during the run. */
  private fresh: Column[] | null = null;
  /** Numbers of route data this search has written to its log. */
  private logEnd = 0;
  /** How far each other search's log has been read. */
  private readonly logRead = new Map<SharedArrayBuffer, number>();

  /**
   * Adds farrier f's route `seq` of cost `cost` (feasible; the cheaper order of one job set is kept).
   * A route another search met (`shared`) is not logged again for sharing.
   */
  add(f: number, seq: number[], cost: number, shared = false): void {
    if (!seq.length) return;
    let a = 0, b = 0;
    for (const j of seq) { a ^= this.hashA[j]; b ^= this.hashB[j]; }
    const key = a * 67108864 + b;
    const map = this.sets[f];
    const old = map.get(key);
    if (old) {
      if (cost < old.cost) { old.seq = seq.slice(); old.cost = cost; }
      return;
    }
    if (this.count >= this.maxSize) return;
    const c = { farrier: f, seq: seq.slice(), cost };
    map.set(key, c);
    this.count++;
    if (this.fresh && !shared) this.fresh.push(c);
  }

  /** Every pooled route, farrier by farrier. */
  private *columns(): Generator<Column> {
    for (const map of this.sets) yield* map.values();
  }

  /** Adds every planned route of a plan. */
  addPlan(s: State): void {
    for (let f = 0; f < s.routes.length; f++) if (s.evals[f].feasible) this.add(f, s.routes[f], s.evals[f].cost);
  }

  /**
   * Writes the pooled routes into `buf` for another search (see `collectRoutes`), as many as fit:
   * farrier, cost, length and jobs of each, then marks the buffer ready.
   */
  publish(buf: SharedArrayBuffer): void {
    markPublished(buf, writeRoutes(new Float64Array(buf, 8), 0, this.columns()));
  }

  /**
   * Adds the routes another search published in `buf`, waiting up to `waitMs` for them; returns how
   * many were read (0 when none came in time).
   */
  collect(buf: SharedArrayBuffer, waitMs: number): number {
    const head = new Int32Array(buf, 0, 2);
    if (Atomics.load(head, 0) === 0) Atomics.wait(head, 0, 0, waitMs);
    if (Atomics.load(head, 0) !== 1) return 0;
    return this.readRoutes(new Float64Array(buf, 8), 0, head[1], false).read;
  }

  /** Starts keeping the routes added from now on for `shareTo`. */
  logRoutes(): void {
    this.fresh ??= [];
  }

  /**
   * Appends the routes met since the last call to this search's log (`routeLogBuffer`), as many as
   * fit, and marks cycle `cycle` published.
   */
  shareTo(log: SharedArrayBuffer, cycle: number): void {
    const { head, data } = logViews(log);
    const q = writeRoutes(data, this.logEnd, this.fresh ?? []);
    this.fresh = [];
    this.logEnd = q;
    if (cycle < LOG_CYCLES) {
      head[LOG_HEAD + cycle] = q;
      Atomics.store(head, 1, cycle + 1);
      Atomics.notify(head, 1);
    }
  }

  /**
   * Adds the routes the other searches logged up to the end of their cycle `cycle`, waiting up to
   * `waitMs` for each to get there (or end); with no wait, whatever they have published so far.
   * Under an iteration limit the searches' cycles line up, so with a wait what each search reads is
   * the same in every run. Returns how many routes were read.
   */
  takeFrom(logs: SharedArrayBuffer[], cycle: number, waitMs: number): number {
    let read = 0;
    const until = performance.now() + waitMs;
    for (const log of logs) {
      const { head, data } = logViews(log);
      for (;;) {
        const published = Atomics.load(head, 1);
        if (published > cycle || cycle >= LOG_CYCLES || Atomics.load(head, 2) === 1) break;
        const left = until - performance.now();
        if (left <= 0) break;
        Atomics.wait(head, 1, published, left);
      }
      const published = Math.min(Atomics.load(head, 1), cycle + 1, LOG_CYCLES);
      const end = published > 0 ? head[LOG_HEAD + published - 1] : 0;
      const r = this.readRoutes(data, this.logRead.get(log) ?? 0, end, true);
      read += r.read;
      this.logRead.set(log, r.end);
    }
    return read;
  }

  /** Adds the routes written in data[q..end) (`writeRoutes`), skipping any that name no farrier or job of this day. */
  private readRoutes(data: Float64Array, q: number, end: number, shared: boolean): { read: number; end: number } {
    let read = 0;
    while (q < end) {
      const f = data[q], cost = data[q + 1], n = data[q + 2];
      const seq = Array.from(data.subarray(q + 3, q + 3 + n));
      q += 3 + n;
      if (f >= 0 && f < this.sets.length && seq.every((j) => j >= 0 && j < this.m.nJobs)) { this.add(f, seq, cost, shared); read++; }
    }
    return { read, end: q };
  }

  clear(): void {
    for (const map of this.sets) map.clear();
    this.count = 0;
  }

  /**
   * The best plan the pooled routes make, as one job sequence per farrier, when it is better than
   * `best` (fewer mandatory jobs left out, or as many and cheaper); null otherwise. A route's value
   * is the leave-out costs of the jobs it does minus its cost; a mandatory job the incumbent leaves
   * out is worth more than every other job and route together, so a plan that fits it wins.
   */
  recombine(best: State, limits: PackLimits = {}): number[][] | null {
    const m = this.m, N = m.nJobs, F = m.nFarriers;
    this.addPlan(best);
    const must = new Uint8Array(N);
    const worth = new Float64Array(N);
    let total = 0;
    for (let f = 0; f < F; f++) total += Math.max(0, best.evals[f].cost);
    for (let j = 0; j < N; j++) if (!m.mandatory[j]) total += m.leaveOutCost[j];
    for (let j = 0; j < N; j++) {
      if (!m.mandatory[j]) worth[j] = m.leaveOutCost[j];
      else if (best.routeOf[j] >= 0) must[j] = 1;
      else worth[j] = total + 1;
    }
    let length = 0;
    for (const map of this.sets) for (const c of map.values()) length += c.seq.length;
    const start = new Int32Array(this.count + 1), items = new Int32Array(length);
    const group = new Int32Array(this.count), value = new Float64Array(this.count);
    const cols: Column[] = [];
    let k = 0, q = 0;
    for (const map of this.sets) for (const c of map.values()) {
      let v = -c.cost;
      for (const j of c.seq) { items[q++] = j; v += worth[j]; }
      group[k] = c.farrier; value[k] = v; cols.push(c);
      start[++k] = q;
    }
    let incumbent = 0;
    for (let f = 0; f < F; f++) if (best.routes[f].length) {
      incumbent -= best.evals[f].cost;
      for (const j of best.routes[f]) incumbent += worth[j];
    }
    const beat = incumbent + 1e-7 * Math.max(1, Math.abs(incumbent));
    const res = packColumns(N, F, { start, items, group, value }, must, beat, { ...limits, prices: this.prices });
    if (!res.chosen) return null;
    const routes: number[][] = Array.from({ length: F }, () => []);
    for (const c of res.chosen) routes[cols[c].farrier] = cols[c].seq.slice();
    return routes;
  }
}

/** Shared buffer for one search's routes (`DayRoutePool.publish`), 8 MB: about 60,000 routes of ten jobs. */
export function routeExchangeBuffer(bytes = 8 * 1024 * 1024): SharedArrayBuffer {
  return new SharedArrayBuffer(bytes);
}

/**
 * Writes routes into `data` from position `q` (farrier, cost, length and jobs of each) until one
 * does not fit; returns the position after the last one written.
 */
function writeRoutes(data: Float64Array, q: number, cols: Iterable<Column>): number {
  for (const c of cols) {
    if (q + 3 + c.seq.length > data.length) break;
    data[q++] = c.farrier; data[q++] = c.cost; data[q++] = c.seq.length;
    for (const j of c.seq) data[q++] = j;
  }
  return q;
}

/** Route log layout: Int32 head (0: unused, 1: cycles published, 2: ended), end offsets per cycle, then route data. */
const LOG_HEAD = 4;
const LOG_CYCLES = 4096;

function logViews(log: SharedArrayBuffer): { head: Int32Array; data: Float64Array } {
  return { head: new Int32Array(log, 0, LOG_HEAD + LOG_CYCLES), data: new Float64Array(log, (LOG_HEAD + LOG_CYCLES) * 4) };
}

/**
 * Shared buffer for one search's log of the routes it meets (`DayRoutePool.shareTo`), which the
 * searches beside it read at each annealing cycle end; 16 MB, about 150,000 routes of ten jobs.
 */
export function routeLogBuffer(bytes = 16 * 1024 * 1024): SharedArrayBuffer {
  return new SharedArrayBuffer(bytes);
}

/** Marks a search's route log ended: the others stop waiting for its next cycles. */
export function endRouteLog(log: SharedArrayBuffer): void {
  const head = new Int32Array(log, 0, LOG_HEAD);
  Atomics.store(head, 2, 1);
  Atomics.notify(head, 1);
}

/** Marks `buf` ready with `length` numbers of routes (0 when a search had none to give). */
export function markPublished(buf: SharedArrayBuffer, length: number): void {
  const head = new Int32Array(buf, 0, 2);
  head[1] = length;
  Atomics.store(head, 0, 1);
  Atomics.notify(head, 0);
}
