import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import os from 'node:os';
import { checkSolution } from '../../src/lib/solver/checker';
import { mandatoryLeftOut, solve } from '../../src/lib/solver/solve';
import { solveInWorker } from '../../src/lib/solver/worker';
import { farrierDay } from '../../src/lib/solver/invented-day';
import { runSolomon, runTsplib } from './runs';

function csv(path: string): Record<string, string>[] {
  const [head, ...rows] = readFileSync(path, 'utf8').trim().split(/\r?\n/);
  const cols = head.split(',');
  return rows.map((r) => {
    const f = r.match(/("([^"]*)"|[^,]*)(,|$)/g)!.map((x) => x.replace(/,$/, '').replace(/^"|"$/g, ''));
    return Object.fromEntries(cols.map((c, i) => [c, f[i]]));
  });
}

/**
 * The invented farrier day for one seed (instance and search seed alike): a short run against a
 * reference run that uses its whole budget (no early stop on a stall). Returns the printed lines
 * and the short run's gap above the reference, so the suite and the CLI report the same figures.
 * With `iterations` both runs are bounded by iteration counts instead of seconds: the engine's
 * schedule counts iterations, so such a pair gives the same figures on a busy machine as on an idle
 * one (the short run is then the exact start of the reference run).
 */
export async function runFarrierDay(seed: number, shortSeconds: number, referenceSeconds: number, iterations?: { short: number; reference: number }, searches = 2) {
  const day = farrierDay({ seed, farriers: 6, jobs: 60, barns: 40, sideM: 40000 });
  const describe = async (label: string, limit: { maxSeconds: number } | { maxIterations: number }, noStall = false) => {
    const r = await solveInWorker(day, { seed, stop: { ...limit, ...(noStall ? { noImprovementIterations: Infinity } : {}) } }, { searches });
    const c = checkSolution(day, r, { complete: true, compareTimes: true });
    const planned = r.routes.reduce((a, x) => a + x.stops.reduce((b, s) => b + s.jobIds.length, 0), 0);
    const mandatoryOut = mandatoryLeftOut(day, r);
    const line = `${pad(label, 22)} stop ${r.statistics.stopReason}, cost ${(r.cost / 100).toFixed(2)} (checker ${(c.costs.totalCents / 100).toFixed(2)}), first plan ${(r.statistics.firstFeasibleSeconds * 1000).toFixed(0)} ms, ${planned} jobs planned, ${r.unplanned.length} unplanned (${mandatoryOut} mandatory), ${r.statistics.iterations} iterations in ${r.statistics.searches ?? 1} search(es), ${r.statistics.seconds.toFixed(1)} s, ${c.feasible ? 'checked feasible' : 'FAIL ' + c.violations[0]?.message}`;
    return { r, line, feasible: c.feasible, mandatoryOut };
  };
  const short = iterations
    ? await describe(`${iterations.short}-iteration budget`, { maxIterations: iterations.short })
    : await describe(`${shortSeconds}-second budget`, { maxSeconds: shortSeconds });
  const ref = iterations
    ? await describe(`${iterations.reference}-iteration budget`, { maxIterations: iterations.reference }, true)
    : await describe(`${referenceSeconds}-second budget`, { maxSeconds: referenceSeconds }, true);
  return {
    lines: [short.line, ref.line], short: short.r, reference: ref.r, feasible: short.feasible && ref.feasible,
    gapPct: ((short.r.cost - ref.r.cost) / ref.r.cost) * 100,
    /**
     * Mandatory jobs the short run leaves out beyond the reference's: when positive the short run is
     * the worse plan, when negative the better one, whatever the costs say (a mandatory job left
     * out is listed, not priced).
     */
    extraMandatoryOut: short.mandatoryOut - ref.mandatoryOut,
  };
}

/**
 * How a short run compares with its reference, in words, and whether it meets the target (within
 * 1 % of the reference's cost, or planning more mandatory jobs than the reference does).
 */
export function judgeFarrierDay(r: { gapPct: number; extraMandatoryOut: number }, shortName: string, refName: string): { text: string; within: boolean; worse: boolean } {
  const gap = `${shortName} result is ${r.gapPct.toFixed(2)} % above the ${refName} result`;
  if (r.extraMandatoryOut > 0) return { text: `${gap} but leaves ${r.extraMandatoryOut} more mandatory job(s) out`, within: false, worse: true };
  if (r.extraMandatoryOut < 0) return { text: `${gap} but plans ${-r.extraMandatoryOut} more mandatory job(s), so it is the better plan`, within: true, worse: false };
  return { text: gap, within: r.gapPct <= 1, worse: false };
}

const pad = (s: string | number, n: number) => String(s).padEnd(n);
const padL = (s: string | number, n: number) => String(s).padStart(n);
const out = (s: string) => process.stdout.write(s + '\n');

/**
 * Runs every published instance with a fixed budget, then the invented farrier day (3 s against
 * 60 s) and the 1,000-job scale run. Every result is re-checked; figures are printed, never asserted.
 */
export async function runSuite(o: { secondsTsp: number; secondsVrptw: number; seed: number; root: string }) {
  out(`Roundsmith plan engine benchmark — seed ${o.seed}, TSP ${o.secondsTsp} s, VRPTW ${o.secondsVrptw} s each; ${os.cpus().length} CPUs, load average at start ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  out('');
  const tspDir = join(o.root, 'tsplib');
  const optimal = new Map(csv(join(tspDir, 'optimal.csv')).map((r) => [r.instance, Number(r.optimal)]));
  out(`${pad('TSPLIB', 12)}${padL('optimum', 9)}${padL('ours', 9)}${padL('gap %', 8)}${padL('seconds', 9)}  check`);
  const tspGaps: number[] = [];
  for (const f of readdirSync(tspDir).filter((x) => x.endsWith('.tsp')).sort()) {
    const r = runTsplib(join(tspDir, f), o.secondsTsp, o.seed);
    const opt = optimal.get(r.instance);
    const gap = opt ? ((r.length - opt) / opt) * 100 : NaN;
    if (opt) tspGaps.push(gap);
    out(`${pad(r.instance, 12)}${padL(opt ?? '-', 9)}${padL(r.length, 9)}${padL(gap.toFixed(2), 8)}${padL(r.seconds.toFixed(1), 9)}  ${r.check.feasible ? 'ok' : 'FAIL ' + r.check.errors[0]}`);
  }
  out(`${pad('average', 30)}${padL((tspGaps.reduce((a, b) => a + b, 0) / tspGaps.length).toFixed(2), 8)}`);
  out('');

  const solDir = join(o.root, 'solomon');
  const bks = new Map(csv(join(solDir, 'bks.csv')).map((r) => [r.instance, { vehicles: Number(r.vehicles), distance: Number(r.distance) }]));
  out(`${pad('Solomon', 9)}${padL('BKS veh', 8)}${padL('BKS dist', 10)}${padL('our veh', 8)}${padL('our dist', 10)}${padL('gap %', 8)}${padL('seconds', 9)}  check`);
  const gaps: number[] = [], sameFleetGaps: number[] = [];
  let withinOne = 0, atBks = 0, count = 0;
  for (const f of readdirSync(solDir).filter((x) => x.endsWith('.txt')).sort()) {
    const r = runSolomon(join(solDir, f), o.secondsVrptw, o.seed);
    const key = f.replace(/\.txt$/, '').toLowerCase();
    const b = bks.get(key);
    const gap = b ? ((r.distance - b.distance) / b.distance) * 100 : NaN;
    if (b) { gaps.push(gap); count++; if (r.vehicles <= b.vehicles + 1) withinOne++; if (r.vehicles <= b.vehicles) atBks++; if (r.vehicles === b.vehicles) sameFleetGaps.push(gap); }
    out(`${pad(key, 9)}${padL(b?.vehicles ?? '-', 8)}${padL(b?.distance.toFixed(2) ?? '-', 10)}${padL(r.vehicles, 8)}${padL(r.distance.toFixed(2), 10)}${padL(gap.toFixed(2), 8)}${padL(r.seconds.toFixed(1), 9)}  ${r.check.feasible ? 'ok' : 'FAIL ' + r.check.errors[0]}`);
  }
  const avg = (a: number[]) => (a.length ? (a.reduce((x, y) => x + y, 0) / a.length).toFixed(2) : '-');
  out(`vehicles <= BKS+1 on ${withinOne}/${count}; = BKS on ${atBks}/${count}`);
  out(`average distance gap, all instances: ${avg(gaps)} % (an extra vehicle usually shortens the distance, so this flatters); on the ${sameFleetGaps.length} instances at the BKS vehicle count: ${avg(sameFleetGaps)} %`);
  out('');

  out('Farrier day (invented: 6 farriers, 60 jobs at 40 barns, mixed work, pins and owner windows)');
  const fd = await runFarrierDay(o.seed, 3, 60);
  out(fd.lines[0]);
  out(fd.lines[1]);
  out(judgeFarrierDay(fd, '3-s', '60-s').text);
  out('');

  out('Scale (invented: 50 farriers, 1,000 jobs at 600 barns), 30-second budget');
  const big = farrierDay({ seed: o.seed, farriers: 50, jobs: 1000, barns: 600, sideM: 150000 });
  let peak = process.memoryUsage().rss;
  const rb = solve(big, { seed: o.seed, stop: { maxSeconds: 30 }, onProgress: () => { peak = Math.max(peak, process.memoryUsage().rss); } });
  peak = Math.max(peak, process.memoryUsage().rss);
  const cb = checkSolution(big, rb, { complete: true });
  const planned = rb.routes.reduce((a, x) => a + x.stops.reduce((b, s) => b + s.jobIds.length, 0), 0);
  out(`first feasible plan ${rb.statistics.firstFeasibleSeconds.toFixed(2)} s; after ${rb.statistics.seconds.toFixed(1)} s: ${planned} jobs planned, ${rb.unplanned.length} unplanned, cost ${(rb.cost / 100).toFixed(2)}, ${rb.statistics.iterations} iterations; peak RSS ${(peak / 1048576).toFixed(0)} MB (process maxRSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB); ${cb.feasible ? 'checked feasible' : 'FAIL ' + cb.violations[0]?.message}`);
  out(`load average at end ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
}
