import { evalRoute } from './route-eval';
import type { Rng } from './random';
import type { State } from './state';

/**
 * Local-search moves for time-window routing. Each move knows the routes it rewrites; `evaluate()` is
 * pure (returns the exact cost change, Infinity when a hard rule breaks) and `apply()` commits it.
 * Moves are built around a job `u` and one of its near neighbours `v` (granular neighbourhoods).
 */
export type MoveKind = 'relocate' | 'swap' | 'two-opt-star' | 'or-opt' | 'cross-exchange' | 'two-opt' | 'insert-unplanned' | 'exchange-unplanned';

/** A local-search move: the routes it rewrites and the jobs it brings into or out of the plan. */
export class Move {
  /**
   * `changes`: new sequences of the routes the move rewrites. `enter` / `leave`: jobs that join the
   * plan from the unplanned list or leave it (their leave-out costs are part of the change).
   */
  constructor(readonly kind: MoveKind, readonly changes: { f: number; seq: number[] }[], readonly enter: number[] = [], readonly leave: number[] = []) {}

  /** Exact cost change of the move on `s`, without changing `s`. */
  evaluate(s: State): number {
    let d = 0;
    for (const j of this.enter) d -= s.m.leaveOutCost[j];
    for (const j of this.leave) d += s.m.leaveOutCost[j];
    for (const c of this.changes) {
      const e = evalRoute(s.m, c.f, c.seq);
      if (!e.feasible) return Infinity;
      d += e.cost - s.evals[c.f].cost;
    }
    return d;
  }

  apply(s: State): void {
    for (const c of this.changes) s.routes[c.f] = c.seq.slice();
    for (const j of this.leave) { s.routeOf[j] = -1; s.unassigned.add(j); }
    for (const j of this.enter) s.unassigned.delete(j);
    for (const c of this.changes) s.refresh(c.f);
    s.recomputeCost();
  }
}

/**
 * Moves between the plan and the unplanned list, for days where some jobs may be left out:
 * insert an unplanned job u next to a planned neighbour v, or put u in v's place (v leaves).
 */
export function unplannedMoves(s: State, u: number, v: number): Move[] {
  const B = s.routeOf[v];
  if (B < 0 || s.routeOf[u] >= 0 || !s.m.eligible[B * s.m.nJobs + u]) return [];
  const rb = s.routes[B], b = rb.indexOf(v);
  return [
    new Move('insert-unplanned', [{ f: B, seq: [...rb.slice(0, b + 1), u, ...rb.slice(b + 1)] }], [u]),
    new Move('insert-unplanned', [{ f: B, seq: [...rb.slice(0, b), u, ...rb.slice(b)] }], [u]),
    new Move('exchange-unplanned', [{ f: B, seq: [...rb.slice(0, b), u, ...rb.slice(b + 1)] }], [u], [v]),
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
  const out: Move[] = [];
  if (A !== B) {
    // relocate u after v and before v
    out.push(new Move('relocate', [
      { f: A, seq: [...ra.slice(0, a), ...ra.slice(a + 1)] },
      { f: B, seq: [...rb.slice(0, b + 1), u, ...rb.slice(b + 1)] },
    ]));
    out.push(new Move('relocate', [
      { f: A, seq: [...ra.slice(0, a), ...ra.slice(a + 1)] },
      { f: B, seq: [...rb.slice(0, b), u, ...rb.slice(b)] },
    ]));
    // swap u and v
    out.push(new Move('swap', [
      { f: A, seq: [...ra.slice(0, a), v, ...ra.slice(a + 1)] },
      { f: B, seq: [...rb.slice(0, b), u, ...rb.slice(b + 1)] },
    ]));
    // 2-opt*: tails exchanged after u and after v; and so that u is followed by v
    out.push(new Move('two-opt-star', [
      { f: A, seq: [...ra.slice(0, a + 1), ...rb.slice(b + 1)] },
      { f: B, seq: [...rb.slice(0, b + 1), ...ra.slice(a + 1)] },
    ]));
    out.push(new Move('two-opt-star', [
      { f: A, seq: [...ra.slice(0, a + 1), ...rb.slice(b)] },
      { f: B, seq: [...rb.slice(0, b), ...ra.slice(a + 1)] },
    ]));
    // or-opt: segment of 2 or 3 starting at u inserted after v
    for (let len = 2; len <= 3; len++) {
      if (a + len > ra.length) break;
      const seg = ra.slice(a, a + len);
      out.push(new Move('or-opt', [
        { f: A, seq: [...ra.slice(0, a), ...ra.slice(a + len)] },
        { f: B, seq: [...rb.slice(0, b + 1), ...seg, ...rb.slice(b + 1)] },
      ]));
    }
    // cross-exchange: segments starting at u and at v, lengths 1..3 (not both 1: that is swap)
    for (let la = 1; la <= 3 && a + la <= ra.length; la++) {
      for (let lb = 1; lb <= 3 && b + lb <= rb.length; lb++) {
        if (la === 1 && lb === 1) continue;
        out.push(new Move('cross-exchange', [
          { f: A, seq: [...ra.slice(0, a), ...rb.slice(b, b + lb), ...ra.slice(a + la)] },
          { f: B, seq: [...rb.slice(0, b), ...ra.slice(a, a + la), ...rb.slice(b + lb)] },
        ]));
      }
    }
  } else if (a !== b) {
    // intra-route relocate of u to just after v, or-opt of 2..3, swap, and 2-opt (reverse between)
    const without = [...ra.slice(0, a), ...ra.slice(a + 1)];
    const vb = without.indexOf(v);
    out.push(new Move('relocate', [{ f: A, seq: [...without.slice(0, vb + 1), u, ...without.slice(vb + 1)] }]));
    out.push(new Move('relocate', [{ f: A, seq: [...without.slice(0, vb), u, ...without.slice(vb)] }]));
    for (let len = 2; len <= 3; len++) {
      if (a + len > ra.length || (b >= a && b < a + len)) continue;
      const seg = ra.slice(a, a + len);
      const rest = [...ra.slice(0, a), ...ra.slice(a + len)];
      const vi = rest.indexOf(v);
      out.push(new Move('or-opt', [{ f: A, seq: [...rest.slice(0, vi + 1), ...seg, ...rest.slice(vi + 1)] }]));
    }
    const sw = ra.slice();
    sw[a] = v; sw[b] = u;
    out.push(new Move('swap', [{ f: A, seq: sw }]));
    const i = Math.min(a, b), k = Math.max(a, b);
    out.push(new Move('two-opt', [{ f: A, seq: [...ra.slice(0, i), ...ra.slice(i, k + 1).reverse(), ...ra.slice(k + 1)] }]));
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
    out.push(new Move('relocate', [{ f: A, seq: [...ra.slice(0, a), ...ra.slice(a + 1)] }, { f, seq: [u] }]));
    if (s.m.fleetObjective) break;
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
