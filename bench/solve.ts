/**
 * Benchmark CLI.
 *   npm run --silent bench -- --solomon FILE --seconds S [--seed N] --json
 *   npm run --silent bench -- --tsplib FILE --seconds S [--seed N] --json
 *   npm run bench -- --suite [--seconds-tsp 5] [--seconds-vrptw 30] [--seed N]
 * Single-instance runs print one JSON object on stdout (nothing else); the suite prints a table of
 * published value, our value, gap and seconds, each result re-checked by an independent checker.
 */
import { basename, resolve } from 'node:path';
import { runSolomon, runTsplib } from './lib/runs';
import { runSuite } from './lib/suite';

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

async function main() {
  const seed = num('--seed', 1);
  if (has('--suite')) {
    await runSuite({ secondsTsp: num('--seconds-tsp', 5), secondsVrptw: num('--seconds-vrptw', 30), seed, root: resolve(process.cwd(), '..', 'shared', 'benchmarks') });
    return;
  }
  const solomon = arg('--solomon'), tsplib = arg('--tsplib');
  if (!solomon && !tsplib) {
    process.stderr.write('usage: bench --solomon FILE | --tsplib FILE [--seconds S] [--seed N] [--json] | --suite\n');
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
