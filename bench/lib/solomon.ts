import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { createProblem, type Problem } from '../../src/lib/solver/problem';

/** One Solomon instance as published: row 0 is the depot. */
export interface SolomonInstance {
  name: string;
  vehicles: number;
  capacity: number;
  x: number[]; y: number[]; demand: number[]; ready: number[]; due: number[]; service: number[];
}

/** Parses Solomon's text format by whitespace (files have trailing spaces and a split header). */
export function parseSolomon(path: string): SolomonInstance {
  const lines = readFileSync(path, 'utf8').split(/\r?\n/);
  const name = (lines.find((l) => l.trim()) ?? basename(path)).trim();
  let i = lines.findIndex((l) => /NUMBER\s+CAPACITY/.test(l));
  if (i < 0) throw new Error(`${path}: no VEHICLE section`);
  const [vehicles, capacity] = lines[i + 1].trim().split(/\s+/).map(Number);
  i = lines.findIndex((l) => /CUST\s+NO/.test(l));
  const inst: SolomonInstance = { name, vehicles, capacity, x: [], y: [], demand: [], ready: [], due: [], service: [] };
  for (const l of lines.slice(i + 1)) {
    const f = l.trim().split(/\s+/).map(Number);
    if (f.length < 7 || f.some((v) => Number.isNaN(v))) continue;
    if (f[0] !== inst.x.length) throw new Error(`${path}: customer ${f[0]} out of order`);
    inst.x.push(f[1]); inst.y.push(f[2]); inst.demand.push(f[3]); inst.ready.push(f[4]); inst.due.push(f[5]); inst.service.push(f[6]);
  }
  return inst;
}

export const solomonDistance = (s: SolomonInstance, a: number, b: number) => Math.hypot(s.x[a] - s.x[b], s.y[a] - s.y[b]);

/**
 * Solomon times are unrounded doubles; the engine works in integers, so every time is scaled by
 * SCALE and each travel time rounded UP. A plan feasible for the engine is then feasible with exact
 * doubles (all ready/due/service values are integers, scaled exactly); the reported distance is
 * recomputed from the routes in doubles.
 */
export const SCALE = 1_000_000;

export function solomonProblem(s: SolomonInstance): Problem {
  const n = s.x.length;
  const dur: number[][] = [], dist: number[][] = [];
  for (let a = 0; a < n; a++) {
    dur.push([]); dist.push([]);
    for (let b = 0; b < n; b++) {
      const d = solomonDistance(s, a, b);
      dur[a].push(Math.ceil(d * SCALE - 1e-6));
      dist[a].push(Math.round(d * SCALE));
    }
  }
  const horizon = s.due[0] * SCALE;
  return createProblem({
    locations: n,
    durationSec: dur,
    distanceM: dist,
    windowMode: 'start-only',
    objective: 'fleet-then-distance',
    farriers: Array.from({ length: s.vehicles }, (_, v) => ({
      id: `v${v + 1}`, startLocation: 0, endLocation: 0, shiftStartSec: s.ready[0] * SCALE, shiftEndSec: horizon,
      normalWorkSec: horizon, maxOvertimeSec: 0, qualified: true, hasForge: true, capacity: s.capacity,
    })),
    barns: Array.from({ length: n - 1 }, (_, c) => ({ id: `c${c + 1}`, location: c + 1, windows: [{ startSec: s.ready[c + 1] * SCALE, endSec: s.due[c + 1] * SCALE }], setupSec: 0 })),
    jobs: Array.from({ length: n - 1 }, (_, c) => ({ id: String(c + 1), barnId: `c${c + 1}`, durationSec: s.service[c + 1] * SCALE, demand: s.demand[c + 1] })),
  });
}

/**
 * Independent check of a Solomon solution in exact doubles with the published rules: every customer
 * once, capacity, service starting by the due date, back at the depot by its due date.
 */
export function checkSolomon(s: SolomonInstance, routes: number[][]): { feasible: boolean; errors: string[]; vehicles: number; distance: number } {
  const errors: string[] = [];
  const n = s.x.length;
  const seen = new Uint8Array(n);
  let distance = 0;
  for (const r of routes) {
    if (!r.length) continue;
    let t = 0, load = 0, prev = 0;
    for (const c of r) {
      if (!(c >= 1 && c < n)) { errors.push(`bad customer ${c}`); continue; }
      if (seen[c]) errors.push(`customer ${c} twice`);
      seen[c] = 1;
      const d = solomonDistance(s, prev, c);
      distance += d;
      t = Math.max(t + d, s.ready[c]);
      if (t > s.due[c]) errors.push(`customer ${c} starts at ${t.toFixed(3)} > due ${s.due[c]}`);
      t += s.service[c];
      load += s.demand[c];
      prev = c;
    }
    const back = solomonDistance(s, prev, 0);
    distance += back;
    if (t + back > s.due[0]) errors.push(`route back at ${(t + back).toFixed(3)} > ${s.due[0]}`);
    if (load > s.capacity) errors.push(`load ${load} > ${s.capacity}`);
  }
  for (let c = 1; c < n; c++) if (!seen[c]) errors.push(`customer ${c} not served`);
  const vehicles = routes.filter((r) => r.length).length;
  if (vehicles > s.vehicles) errors.push(`${vehicles} vehicles > fleet ${s.vehicles}`);
  return { feasible: errors.length === 0, errors, vehicles, distance };
}
