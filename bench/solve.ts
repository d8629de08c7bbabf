/**
 * Benchmark CLI.
 *   npm run --silent bench -- --solomon FILE --seconds S [--seed N] --json
 *   npm run --silent bench -- --tsplib FILE --seconds S [--seed N] --json
 *   npm run bench -- --suite [--seconds-tsp 5] [--seconds-vrptw 30] [--seed N]
 *   npm run bench -- --farrier-day [--seeds 1-5] [--seconds 3] [--reference-seconds 60] [--searches 2]
 *   npm run bench -- --farrier-day [--seeds 1-10] --iterations 25000 --reference-iterations 500000
 * The farrier day runs as the dispatch screen does: side-by-side searches (default 2) in worker
 * threads, the best plan kept; an iteration budget is then each search's.
 * Single-instance runs print one JSON object on stdout (nothing else); the suite prints a table of
 * published value, our value, gap and seconds, each result re-checked by an independent checker.
 */
import { basename, resolve } from 'node:path';
import { runSolomon, runTsplib } from './lib/runs';
import { judgeFarrierDay, runFarrierDay, runSuite } from './lib/suite';

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}
const has = (name: string) => process.argv.includes(name);
const num = (name: string, dflt: number) => {
  const v = arg(name);
  if (v === undefined) return dflt;
  const n = Number(v);
  if (!Number.isFinite(n) || n < 0) throw new Error(`${name} needs a non-negative number, got ${v}`);
  return n;
};

/** "1-5" or "1,3,7" → seed list. */
function parseSeeds(v: string): number[] {
  const out: number[] = [];
  for (const part of v.split(',')) {
    const m = part.match(/^(\d+)(?:-(\d+))?$/);
    if (!m) throw new Error(`--seeds needs a list like 1-5 or 1,3,7, got ${v}`);
    const a = Number(m[1]), b = m[2] === undefined ? a : Number(m[2]);
    for (let x = a; x <= b; x++) out.push(x);
  }
  return out;
}

async function main() {
  const seed = num('--seed', 1);
  if (has('--suite')) {
    await runSuite({ secondsTsp: num('--seconds-tsp', 5), secondsVrptw: num('--seconds-vrptw', 30), seed, root: resolve(process.cwd(), '..', 'shared', 'benchmarks') });
    return;
  }
  if (has('--farrier-day')) {
    const seeds = parseSeeds(arg('--seeds') ?? String(seed));
    const short = num('--seconds', 3), ref = num('--reference-seconds', 60);
    // iteration budgets: figures that do not depend on how busy the machine is
    const its = arg('--iterations') === undefined ? undefined : { short: num('--iterations', 25000), reference: num('--reference-iterations', 500000) };
    const shortName = its ? `${its.short}-iteration` : `${short}-s`, refName = its ? `${its.reference}-iteration` : `${ref}-s`;
    const gaps: number[] = [];
    let within = 0, misses = 0;
    for (const s of seeds) {
      const r = await runFarrierDay(s, short, ref, its, num('--searches', 2));
      const judged = judgeFarrierDay(r, shortName, refName);
      process.stdout.write(`seed ${s}\n  ${r.lines[0]}\n  ${r.lines[1]}\n  ${judged.text}\n`);
      gaps.push(r.gapPct);
      if (judged.worse) misses++;
      if (judged.within) within++;
      if (!r.feasible) process.exitCode = 1;
    }
    const mean = gaps.reduce((a, b) => a + b, 0) / gaps.length;
    process.stdout.write(`seeds ${seeds.join(', ')}: gap mean ${mean.toFixed(2)} %, worst ${Math.max(...gaps).toFixed(2)} %; within 1 % on ${within} of ${seeds.length}${misses ? `; ${misses} short run(s) leave more mandatory jobs out than their reference` : ''}\n`);
    return;
  }
  const solomon = arg('--solomon'), tsplib = arg('--tsplib');
  if (!solomon && !tsplib) {
    process.stderr.write('usage: bench --solomon FILE | --tsplib FILE [--seconds S] [--seed N] [--json] | --suite | --farrier-day [--seeds 1-5] [--seconds S --reference-seconds S | --iterations N --reference-iterations N] [--searches N]\n');
    process.exit(2);
  }
  if (solomon) {
    const r = runSolomon(solomon, num('--seconds', 30), seed);
    if (!r.check.feasible) process.stderr.write(`checker: ${r.check.errors.slice(0, 5).join('; ')}\n`);
    const out = { instance: r.instance, vehicles: r.vehicles, distance: Math.round(r.distance * 100) / 100, seconds: Math.round(r.seconds * 100) / 100, routes: r.routes };
    if (has('--json')) process.stdout.write(JSON.stringify(out) + '\n');
    else process.stdout.write(`${out.instance}: ${out.vehicles} vehicles, distance ${out.distance.toFixed(2)}, ${out.seconds.toFixed(1)} s, ${r.check.feasible ? 'checked feasible' : 'INFEASIBLE'} (${basename(solomon)})\n`);
    if (!r.check.feasible) process.exitCode = 1;
  } else if (tsplib) {
    const r = runTsplib(tsplib, num('--seconds', 5), seed);
    if (!r.check.feasible) process.stderr.write(`checker: ${r.check.errors.slice(0, 5).join('; ')}\n`);
    const out = { instance: r.instance, length: r.length, seconds: Math.round(r.seconds * 100) / 100, tour: r.tour };
    if (has('--json')) process.stdout.write(JSON.stringify(out) + '\n');
    else process.stdout.write(`${out.instance}: length ${out.length}, ${out.seconds.toFixed(1)} s, ${r.check.feasible ? 'checked feasible' : 'INFEASIBLE'}\n`);
    if (!r.check.feasible) process.exitCode = 1;
  }
}

main().catch((e: Error) => {
  process.stderr.write(`${e.message}\n`);
  process.exit(1);
});
