/**
 * Replaces the region's roads with a practice's own OpenStreetMap extract in GeoJSON:
 *
 *   npm run roads:import -- FILE.geojson [--name "Our county"] [--attribution "© OpenStreetMap contributors"]
 *                                        [--region-dir tiles] [--check]
 *
 * Everything is validated first; any problem is listed and nothing is written (exit status 1). With
 * --check it only validates. A running server picks the new files up on its next map request.
 * See docs/map-and-roads.md for where such a file comes from and the OpenStreetMap licence duty.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { importRoads, planRoadsImport } from '../src/lib/map/roads-import';

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const valueFlags = new Set(['--name', '--attribution', '--region-dir']);
const file = process.argv.slice(2).find((a, i, all) => !a.startsWith('--') && !valueFlags.has(all[i - 1] ?? ''));
if (!file) {
  console.error('usage: npm run roads:import -- FILE.geojson [--name NAME] [--attribution TEXT] [--region-dir DIR] [--check]');
  process.exit(2);
}

let doc: unknown;
try {
  doc = JSON.parse(readFileSync(file, 'utf8'));
} catch (err) {
  console.error(`Cannot read ${file} as JSON: ${(err as Error).message}. Nothing was written.`);
  process.exit(1);
}

const printList = (title: string, items: string[]) => {
  if (items.length === 0) return;
  console.error(`${title} (${items.length}):`);
  for (const item of items.slice(0, 200)) console.error(`  - ${item}`);
  if (items.length > 200) console.error(`  … and ${items.length - 200} more`);
};

if (process.argv.includes('--check')) {
  const plan = planRoadsImport(doc);
  printList('Problems', plan.problems);
  printList('Warnings', plan.warnings);
  console.log(plan.problems.length ? 'The file cannot be imported as it is.' : `The file can be imported: ${plan.counts.roads} roads.`);
  process.exit(plan.problems.length ? 1 : 0);
}

const result = importRoads(doc, {
  regionDir: path.resolve(arg('--region-dir') ?? 'tiles'),
  name: arg('--name') ?? path.basename(file).replace(/\.(geo)?json$/i, ''),
  attribution: arg('--attribution'),
});
printList('Problems', result.problems);
printList('Warnings', result.warnings);
if (!result.ok) {
  console.error('Nothing was written: fix the problems above and run the import again.');
  process.exit(1);
}
console.log(result.summary);
