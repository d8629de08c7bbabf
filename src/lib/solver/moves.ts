import type { Rng } from './random';
import { materialize, type State } from './state';

/**
 * Local-search moves for time-window routing. Each move knows the routes it rewrites; `evaluate()` is
 * pure (returns the exact cost change, Infinity when a hard rule breaks) and `apply()` commits it.
 * Moves are built around a job `u` and one of its near neighbours `v` (granular neighbourhoods).
 */
export type MoveKind = 'relocate' | 'swap' | 'two-opt-star' | 'or-opt' | 'cross-exchange' | 'two-opt' | 'insert-unplanned' | 'exchange-unplanned' | 'exchange-days';

/**
 * A local-search move: the routes it rewrites and the jobs it brings into or out of the plan. Each
 * rewritten route is a piece list over the current routes (see `Pieces` in state.ts), so that a move
 * is evaluated without building its sequences; `apply()` builds them.
 */
export class Move {
  /**
   * `parts`: the new sequences of the routes the move rewrites, as piece lists. `enter` / `leave`:
   * jobs that join the plan from the unplanned list or leave it (their leave-out costs are part of the change).
   */
  constructor(readonly kind: MoveKind, readonly parts: { f: number; pieces: number[] }[], readonly enter: number[] = [], readonly leave: number[] = []) {}

  /** The new sequences on `s` (before the move is applied). */
  changes(s: State): { f: number; seq: number[] }[] {
    return this.parts.map((c) => ({ f: c.f, seq: materialize(s.routes, c.pieces) }));
  }

  /** Exact cost change of the move on `s`, without changing `s`. */
  evaluate(s: State): number {
    let d = 0;
    for (const j of this.enter) d -= s.m.leaveOutCost[j];
    for (const j of this.leave) d += s.m.leaveOutCost[j];
    for (const c of this.parts) {
      const cost = s.costOf(c.f, c.pieces);
      if (cost === Infinity) return Infinity;
      d += cost - s.evals[c.f].cost;
    }
    return d;
  }

  apply(s: State): void {
    const changes = this.changes(s);
    for (const c of changes) s.routes[c.f] = c.seq;
    for (const j of this.leave) { s.routeOf[j] = -1; s.unassigned.add(j); }
    for (const j of this.enter) s.unassigned.delete(j);
    for (const c of changes) s.refresh(c.f);
    s.recomputeCost();
  }
}

/** Piece: positions a..b−1 of route f (reversed with `rev`). */
const R = (f: number, a: number, b: number, rev = 0) => [f, a, b, rev];
/** Piece: the single job j. */
const J = (j: number) => [-1, j, 0, 0];
function cat(...ps: number[][]): number[] {
  const out: number[] = [];
  for (const p of ps) out.push(p[0], p[1], p[2], p[3]);
  return out;
}

/**
 * Moves between the plan and the unplanned list, for days where some jobs may be left out:
 * insert an unplanned job u next to a planned neighbour v, or put u in v's place (v leaves).
 */
export function unplannedMoves(s: State, u: number, v: number): Move[] {
  const B = s.routeOf[v];
  if (B < 0 || s.routeOf[u] >= 0 || !s.m.eligible[B * s.m.nJobs + u]) return [];
  const rb = s.routes[B], b = rb.indexOf(v), nB = rb.length;
  return [
    new Move('insert-unplanned', [{ f: B, pieces: cat(R(B, 0, b + 1), J(u), R(B, b + 1, nB)) }], [u]),
    new Move('insert-unplanned', [{ f: B, pieces: cat(R(B, 0, b), J(u), R(B, b, nB)) }], [u]),
    new Move('exchange-unplanned', [{ f: B, pieces: cat(R(B, 0, b), J(u), R(B, b + 1, nB)) }], [u], [v]),
  ];
}

/**
 * All moves of each kind between job u (route A, position a) and job v (route B, position b).
 * Inter-route moves require A ≠ B, intra-route moves A = B. Segment lengths up to 3 (or-opt and
 * cross-exchange), as is usual in the literature.
 */
export function movesAround(s: State, u: number, v: number): Move[] {
  const A = s.routeOf[u], B = s.routeOf[v];
  if (A < 0 || B < 0) return [];
  const ra = s.routes[A], rb = s.routes[B];
  const a = ra.indexOf(u), b = rb.indexOf(v);
  const nA = ra.length, nB = rb.length;
  const out: Move[] = [];
  if (A !== B) {
    const withoutU = cat(R(A, 0, a), R(A, a + 1, nA));
    // relocate u after v and before v
    out.push(new Move('relocate', [{ f: A, pieces: withoutU }, { f: B, pieces: cat(R(B, 0, b + 1), J(u), R(B, b + 1, nB)) }]));
    out.push(new Move('relocate', [{ f: A, pieces: withoutU }, { f: B, pieces: cat(R(B, 0, b), J(u), R(B, b, nB)) }]));
    // swap u and v
    out.push(new Move('swap', [{ f: A, pieces: cat(R(A, 0, a), J(v), R(A, a + 1, nA)) }, { f: B, pieces: cat(R(B, 0, b), J(u), R(B, b + 1, nB)) }]));
    // 2-opt*: tails exchanged after u and after v; and so that u is followed by v
    out.push(new Move('two-opt-star', [{ f: A, pieces: cat(R(A, 0, a + 1), R(B, b + 1, nB)) }, { f: B, pieces: cat(R(B, 0, b + 1), R(A, a + 1, nA)) }]));
    out.push(new Move('two-opt-star', [{ f: A, pieces: cat(R(A, 0, a + 1), R(B, b, nB)) }, { f: B, pieces: cat(R(B, 0, b), R(A, a + 1, nA)) }]));
    // or-opt: segment of 2 or 3 starting at u inserted after v
    for (let len = 2; len <= 3; len++) {
      if (a + len > nA) break;
      out.push(new Move('or-opt', [{ f: A, pieces: cat(R(A, 0, a), R(A, a + len, nA)) }, { f: B, pieces: cat(R(B, 0, b + 1), R(A, a, a + len), R(B, b + 1, nB)) }]));
    }
    // cross-exchange: segments starting at u and at v, lengths 1..3 (not both 1: that is swap)
    for (let la = 1; la <= 3 && a + la <= nA; la++) {
      for (let lb = 1; lb <= 3 && b + lb <= nB; lb++) {
        if (la === 1 && lb === 1) continue;
        out.push(new Move('cross-exchange', [
          { f: A, pieces: cat(R(A, 0, a), R(B, b, b + lb), R(A, a + la, nA)) },
          { f: B, pieces: cat(R(B, 0, b), R(A, a, a + la), R(B, b + lb, nB)) },
        ]));
      }
    }
  } else if (a !== b) {
    // intra-route relocate of u to just after / before v, or-opt of 2..3, swap, and 2-opt (reverse between)
    if (a < b) {
      out.push(new Move('relocate', [{ f: A, pieces: cat(R(A, 0, a), R(A, a + 1, b + 1), J(u), R(A, b + 1, nA)) }]));
      out.push(new Move('relocate', [{ f: A, pieces: cat(R(A, 0, a), R(A, a + 1, b), J(u), R(A, b, nA)) }]));
    } else {
      out.push(new Move('relocate', [{ f: A, pieces: cat(R(A, 0, b + 1), J(u), R(A, b + 1, a), R(A, a + 1, nA)) }]));
      out.push(new Move('relocate', [{ f: A, pieces: cat(R(A, 0, b), J(u), R(A, b, a), R(A, a + 1, nA)) }]));
    }
    for (let len = 2; len <= 3; len++) {
      if (a + len > nA || (b >= a && b < a + len)) continue;
      if (b < a) out.push(new Move('or-opt', [{ f: A, pieces: cat(R(A, 0, b + 1), R(A, a, a + len), R(A, b + 1, a), R(A, a + len, nA)) }]));
      else out.push(new Move('or-opt', [{ f: A, pieces: cat(R(A, 0, a), R(A, a + len, b + 1), R(A, a, a + len), R(A, b + 1, nA)) }]));
    }
    const i = Math.min(a, b), k = Math.max(a, b);
    out.push(new Move('swap', [{ f: A, pieces: cat(R(A, 0, i), J(ra[k]), R(A, i + 1, k), J(ra[i]), R(A, k + 1, nA)) }]));
    out.push(new Move('two-opt', [{ f: A, pieces: cat(R(A, 0, i), R(A, i, k + 1, 1), R(A, k + 1, nA)) }]));
  }
  return out;
}

/** Moves of u into an empty route of an eligible farrier (lets the search use an idle farrier). */
export function movesToEmpty(s: State, u: number): Move[] {
  const A = s.routeOf[u];
  if (A < 0) return [];
  const ra = s.routes[A], a = ra.indexOf(u);
  const out: Move[] = [];
  for (let f = 0; f < s.routes.length; f++) {
    if (f === A || s.routes[f].length || !s.m.eligible[f * s.m.nJobs + u]) continue;
    out.push(new Move('relocate', [{ f: A, pieces: cat(R(A, 0, a), R(A, a + 1, ra.length)) }, { f, pieces: J(u) }]));
    if (s.m.fleetObjective) break;
  }
  return out;
}

/**
 * Whole days traded between two farriers (each may also be driven in reverse): farriers differ in
 * home, skills and forge, so an area can end up with the farrier who lives farther from it, and
 * moving it job by job passes through worse plans.
 */
export function movesBetweenDays(s: State, A: number, B: number): Move[] {
  const nA = s.routes[A].length, nB = s.routes[B].length;
  if (nA + nB === 0) return [];
  const out: Move[] = [];
  for (let ra = 0; ra <= (nA > 1 ? 1 : 0); ra++) {
    for (let rb = 0; rb <= (nB > 1 ? 1 : 0); rb++) {
      out.push(new Move('exchange-days', [{ f: A, pieces: R(B, 0, nB, rb) }, { f: B, pieces: R(A, 0, nA, ra) }]));
    }
  }
  return out;
}

/**
 * First-improvement descent over the moves above with granular neighbourhoods (nearest `k` jobs);
 * `focus` limits it to the jobs of the given routes (the routes the last search step changed).
 * Never accepts a move that does not lower the cost, so it cannot worsen a plan.
 */
export function localSearch(s: State, rng: Rng, k = 15, maxPasses = 50, focus?: Set<number>): number {
  const m = s.m;
  let applied = 0;
  // with a focus, only jobs on those routes are moved (their neighbours may be anywhere)
  const order = focus ? [...focus].flatMap((f) => s.routes[f]) : Array.from({ length: m.nJobs }, (_, i) => i);
  const eps = 1e-7 * Math.max(1, m.typicalArcCost);
  for (let pass = 0; pass < maxPasses; pass++) {
    let improved = false;
    rng.shuffle(order);
    for (const u of order) {
      if (s.routeOf[u] < 0) continue;
      const nb = m.neighbours[u];
      let done = false;
      for (let t = 0; t < Math.min(k, nb.length) && !done; t++) {
        const v = nb[t];
        if (s.routeOf[v] < 0) continue;
        for (const mv of movesAround(s, u, v)) {
          if (mv.evaluate(s) < -eps) { mv.apply(s); applied++; improved = true; done = true; break; }
        }
      }
      if (!done && !m.fleetObjective) {
        for (const mv of movesToEmpty(s, u)) {
          if (mv.evaluate(s) < -eps) { mv.apply(s); applied++; improved = true; break; }
        }
      }
    }
    // whole days traded between farriers (the benchmark fleets' farriers are interchangeable)
    if (!m.fleetObjective) {
      const F = m.nFarriers;
      for (let A = 0; A < F; A++) {
        for (let B = A + 1; B < F; B++) {
          if (focus && !focus.has(A) && !focus.has(B)) continue;
          for (const mv of movesBetweenDays(s, A, B)) {
            if (mv.evaluate(s) < -eps) { mv.apply(s); applied++; improved = true; break; }
          }
        }
      }
    }
    // jobs left out: try to bring each back beside, or instead of, a planned neighbour
    if (s.unassigned.size && !m.fleetObjective) {
      for (const u of [...s.unassigned]) {
        if (s.routeOf[u] >= 0) continue;
        const nb = m.neighbours[u];
        let done = false;
        for (let t = 0; t < Math.min(k, nb.length) && !done; t++) {
          for (const mv of unplannedMoves(s, u, nb[t])) {
            if (mv.evaluate(s) < -eps) { mv.apply(s); applied++; improved = true; done = true; break; }
          }
        }
      }
    }
    if (!improved) break;
  }
  return applied;
}
