// `npm test`: the whole suite on a fresh machine. Installs what is missing (npm packages, Debian's
// mariadb-server and chromium), starts this checkout's private MariaDB (or uses DATABASE_URL), prepares
// the roundsmith_test database with the demo practice, starts the local fakes, builds the app into
// .data/test-dist and serves it on a free port, then runs vitest (unit, integration, end-to-end) with
// the addresses in the environment. Extra arguments go to vitest. Exits with vitest's status.
import path from 'node:path';
import { spawn } from 'node:child_process';
import {
  ensureNodeModules, ensureChromium, startDatabase, withDatabase, step, runTs, startChild,
  waitForOutput, waitForHttp, root, freePort,
} from './lib/setup.mjs';

ensureNodeModules();
ensureChromium();
const database = await startDatabase();
const children = [];
let exitCode = 1;

function cleanUp() {
  for (const child of children) child.kill('SIGTERM');
  database.stop();
}
process.on('SIGINT', () => {
  cleanUp();
  process.exit(130);
});

// TEST_RUN_ID lets several runs share one checkout (each with its own database and build folder).
const runId = (process.env.TEST_RUN_ID ?? '').replace(/[^a-z0-9_]/gi, '');
const testDatabase = runId ? `roundsmith_test_${runId}` : 'roundsmith_test';

try {
  database.ensureDatabase(testDatabase);
  const testUrl = withDatabase(database.url, testDatabase).toString();
  step(`Preparing ${testDatabase} (migrations and the demo practice)…`);
  runTs('scripts/prepare-db.ts', ['--reseed'], { DATABASE_URL: testUrl });

  const fakes = startChild(process.execPath, ['--import', 'tsx', 'scripts/fakes.ts'], {}, 'fakes');
  children.push(fakes);
  const [, smtpPort, fakeHttpPort] = await waitForOutput(fakes, /fakes ready smtp=(\d+) http=(\d+)/);
  const port = String(await freePort(4400 + Math.floor(Math.random() * 400)));
  const outDir = path.join(root, '.data', runId ? `test-dist-${runId}` : 'test-dist');
  const env = {
    DATABASE_URL: testUrl,
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
    FAKES_URL: `http://127.0.0.1:${fakeHttpPort}`,
    APP_URL: `http://127.0.0.1:${port}`,
    ASTRO_OUT_DIR: outDir,
    HOST: '127.0.0.1',
    PORT: port,
  };
  step('Building the app for the browser tests…');
  const build = startChild(path.join(root, 'node_modules', '.bin', 'astro'), ['build'], env, 'build');
  const buildCode = await new Promise((resolve) => build.once('exit', resolve));
  if (buildCode !== 0) throw new Error(`astro build failed (${buildCode})`);
  const app = startChild(process.execPath, [path.join(outDir, 'server', 'entry.mjs')], env, 'app');
  children.push(app);
  await waitForHttp(`${env.APP_URL}/sign-in`, 60_000);

  step('Running vitest…');
  const vitest = spawn(path.join(root, 'node_modules', '.bin', 'vitest'), ['run', ...process.argv.slice(2)], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, ...env, TEST_DATABASE_URL: testUrl },
  });
  exitCode = await new Promise((resolve) => vitest.once('exit', (code) => resolve(code ?? 1)));
} catch (error) {
  console.error(error instanceof Error ? error.message : error);
  exitCode = 1;
} finally {
  cleanUp();
}
process.exit(exitCode);
