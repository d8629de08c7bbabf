// `npm start`: installs what is missing, starts this checkout's private MariaDB and the local fakes,
// migrates, loads the demo practice into an empty database, builds and serves the app.
// `npm run dev` (`--dev`) does the same set-up and runs `astro dev` instead of the built server.
// Ctrl-C stops the app, the fakes and the private MariaDB cleanly; the data stays for the next run.
import path from 'node:path';
import {
  ensureNodeModules, startDatabase, step, runTs, startChild, waitForOutput, root, freePort,
} from './lib/setup.mjs';

const dev = process.argv.includes('--dev');
ensureNodeModules();
const database = await startDatabase();
database.ensureDatabase('roundsmith');
const databaseUrl = database.url.toString();
const children = [];
let stopping = false;

function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  step('Stopping…');
  for (const child of children) child.kill('SIGTERM');
  setTimeout(() => {
    database.stop();
    process.exit(code);
  }, 600);
}
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));

try {
  step('Migrating and loading the demo practice when empty…');
  runTs('scripts/prepare-db.ts', [], { DATABASE_URL: databaseUrl });

  const fakes = startChild(process.execPath, ['--import', 'tsx', 'scripts/fakes.ts'], {
    FAKE_SMTP_PORT: String(await freePort(2525)),
    FAKE_HTTP_PORT: String(await freePort(4520)),
  }, 'fakes');
  children.push(fakes);
  const [, smtpPort, fakeHttpPort] = await waitForOutput(fakes, /fakes ready smtp=(\d+) http=(\d+)/);

  const port = process.env.PORT ?? '4321';
  const env = {
    DATABASE_URL: databaseUrl,
    SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${smtpPort}`,
    FAKES_URL: `http://127.0.0.1:${fakeHttpPort}`,
    APP_URL: process.env.APP_URL ?? `http://localhost:${port}`,
    HOST: '127.0.0.1',
    PORT: port,
  };
  const bin = (name) => path.join(root, 'node_modules', '.bin', name);
  let app;
  if (dev) {
    app = startChild(bin('astro'), ['dev', '--host', '127.0.0.1', '--port', port], env, 'astro');
  } else {
    step('Building (astro build)…');
    const build = startChild(bin('astro'), ['build'], env, 'build');
    children.push(build);
    const code = await new Promise((resolve) => build.once('exit', resolve));
    children.pop();
    if (code !== 0) throw new Error(`astro build failed (${code})`);
    app = startChild(process.execPath, ['dist/server/entry.mjs'], env, 'app');
  }
  children.push(app);
  app.once('exit', (code) => {
    if (!stopping) stopAll(code ?? 1);
  });
  await waitForOutput(app, /(Server listening|Local|ready)/i, 120_000).catch(() => {});
  console.log(`
Roundsmith is running at http://localhost:${port}  (fictional demo practice)

Demo accounts (password: roundsmith-demo)
  lead@demo.test            lead of the demo practice
  dispatcher@demo.test      dispatcher
  farrier1@demo.test … farrier6@demo.test   farriers
  dispatcher@other.test     dispatcher of the second, separate demo practice

Press Ctrl-C to stop the app and the private MariaDB.`);
} catch (error) {
  console.error(error instanceof Error ? error.message : error);
  stopAll(1);
}
