import { readFileSync } from 'node:fs';

/** A TSPLIB EUC_2D instance: node ids 1..n in `ids`, coordinates in x, y. */
export interface TsplibInstance { name: string; ids: number[]; x: number[]; y: number[] }

/** Parses a TSPLIB 95 .tsp file (keyword lines split on the first ':', then NODE_COORD_SECTION). */
export function parseTsplib(path: string): TsplibInstance {
  const lines = readFileSync(path, 'utf8').split(/\r?\n/);
  const inst: TsplibInstance = { name: '', ids: [], x: [], y: [] };
  let inCoords = false;
  let type = '';
  for (const raw of lines) {
    const l = raw.trim();
    if (!l) continue;
    if (l === 'EOF') break;
    if (inCoords) {
      const f = l.split(/\s+/).map(Number);
      if (f.length >= 3 && f.every((v) => !Number.isNaN(v))) { inst.ids.push(f[0]); inst.x.push(f[1]); inst.y.push(f[2]); continue; }
      inCoords = false;
    }
    if (l.startsWith('NODE_COORD_SECTION')) { inCoords = true; continue; }
    const k = l.indexOf(':');
    if (k > 0) {
      const key = l.slice(0, k).trim().toUpperCase(), val = l.slice(k + 1).trim();
      if (key === 'NAME') inst.name = val;
      if (key === 'EDGE_WEIGHT_TYPE') type = val;
    }
  }
  if (type !== 'EUC_2D') throw new Error(`${path}: EDGE_WEIGHT_TYPE ${type || '(none)'} is not supported (EUC_2D only)`);
  return inst;
}

/** TSPLIB EUC_2D edge length: nint of the Euclidean distance, nint(x) = floor(x + 0.5). */
export const euc2d = (t: TsplibInstance, a: number, b: number) => Math.floor(Math.hypot(t.x[a] - t.x[b], t.y[a] - t.y[b]) + 0.5);

export function tsplibMatrix(t: TsplibInstance): Float64Array {
  const n = t.ids.length;
  const d = new Float64Array(n * n);
  for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) d[a * n + b] = euc2d(t, a, b);
  return d;
}

/** Independent check: the tour visits every node id exactly once; length recomputed with EUC_2D. */
export function checkTour(t: TsplibInstance, tour: number[]): { feasible: boolean; errors: string[]; length: number } {
  const errors: string[] = [];
  const index = new Map(t.ids.map((id, i) => [id, i]));
  const seen = new Set<number>();
  for (const id of tour) { if (!index.has(id)) errors.push(`unknown node ${id}`); if (seen.has(id)) errors.push(`node ${id} twice`); seen.add(id); }
  if (seen.size !== t.ids.length) errors.push(`${t.ids.length - seen.size} nodes missing`);
  let length = 0;
  for (let i = 0; i < tour.length; i++) length += euc2d(t, index.get(tour[i])!, index.get(tour[(i + 1) % tour.length])!);
  return { feasible: errors.length === 0, errors, length };
}
