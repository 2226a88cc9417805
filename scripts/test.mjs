#!/usr/bin/env node
// `npm test`: every check of the project, in order, then one line `N passed, N failed`.
//   1. lint: eslint (when the root has a config) and `tsc --noEmit` of every workspace
//   2. physics-core tests (vitest)        3. pwa tests (vitest, jsdom, fake-indexeddb)
//   4. server tests (jest + supertest against the private MariaDB; they create/drop their database)
//   5. browser tests (scripts/e2e/run.mjs in Debian's Chromium against a server on a free port,
//      using a throw-away database)
// Exits non-zero when anything failed. Lint and type checks count one each; other suites count tests.
import fs from 'node:fs';
import path from 'node:path';
import { buildAll } from './lib/build.mjs';
import { ensureChromium } from './lib/chromium.mjs';
import { rootSql, startDatabase, stopDatabase } from './lib/db.mjs';
import { dbTask } from './lib/db-tasks.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { info, onParentExit, runMain, ScriptError } from './lib/log.mjs';
import { dataDir, repoRoot } from './lib/paths.mjs';
import { freePort } from './lib/ports.mjs';
import { npmCmd, run } from './lib/proc.mjs';
import { Tally } from './lib/results.mjs';
import { startServer } from './lib/server.mjs';

const WORKSPACES = ['physics-core', 'pwa', 'sync-server'];
const reportsDir = path.join(dataDir, 'test-results');
const tally = new Tally();
const cleanups = [];

function heading(text) {
  process.stdout.write(`\n=== ${text} ===\n`);
  tally.mark();
}

function workspaceScripts(ws) {
  return JSON.parse(fs.readFileSync(path.join(repoRoot, ws, 'package.json'), 'utf8')).scripts ?? {};
}

function fromError(suite, err) {
  const message = err instanceof ScriptError ? err.message : (err?.stack ?? String(err));
  if (err?.detail) process.stderr.write(`${err.detail}\n`);
  process.stderr.write(`[phasewright] ${suite}: ${message}\n`);
  tally.add(suite, 0, 1, 0, message.split('\n')[0].slice(0, 100));
}

/** Run jobs at most `limit` at a time; each prints its buffered output when it ends. */
async function pool(jobs, limit) {
  const queue = [...jobs];
  const workers = Array.from({ length: Math.min(limit, queue.length) }, async () => {
    while (queue.length) await queue.shift()();
  });
  await Promise.all(workers);
}

/** A check that counts as one: passed when the command exits 0. Output is shown when it ends. */
function checkJob(name, cmd, args) {
  return async () => {
    const t0 = Date.now();
    const r = await run(cmd, args, { capture: true });
    const out = `${r.stdout}${r.stderr}`.trim();
    process.stdout.write(`--- ${name}: ${r.code === 0 ? 'ok' : 'FAILED'} (${((Date.now() - t0) / 1000).toFixed(1)} s)\n`);
    if (r.code !== 0 && out) process.stdout.write(`${out}\n`);
    tally.add(name, r.code === 0 ? 1 : 0, r.code === 0 ? 0 : 1, 0, undefined, (Date.now() - t0) / 1000);
  };
}

async function lint() {
  heading('lint and type checks');
  const hasEslintConfig = ['eslint.config.js', 'eslint.config.mjs', 'eslint.config.cjs', 'eslint.config.ts'].some((f) =>
    fs.existsSync(path.join(repoRoot, f)),
  );
  const jobs = [];
  if (hasEslintConfig) jobs.push(checkJob('eslint', 'npx', ['eslint', '.']));
  else info('no eslint.config.* at the root: eslint skipped');
  for (const ws of WORKSPACES) {
    if (workspaceScripts(ws).typecheck) jobs.push(checkJob(`typecheck ${ws}`, npmCmd, ['run', 'typecheck', '-w', ws]));
  }
  // Two at a time: the machines this runs on have two cores or more.
  await pool(jobs, 2);
}

async function vitest(ws) {
  if (!workspaceScripts(ws).test) {
    info(`${ws} has no test script: skipped`);
    return;
  }
  heading(`${ws} tests (vitest)`);
  const report = path.join(reportsDir, `${ws}.json`);
  fs.rmSync(report, { force: true });
  const r = await run(npmCmd, [
    'test', '-w', ws, '--', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`,
  ]);
  tally.addJsonReport(`${ws} (vitest)`, report, r.code);
}

async function serverTests(settings, env) {
  heading('sync-server tests (jest, real MariaDB)');
  const report = path.join(reportsDir, 'sync-server.json');
  fs.rmSync(report, { force: true });
  const r = await run(npmCmd, ['test', '-w', 'sync-server', '--', '--json', `--outputFile=${report}`], { env });
  tally.addJsonReport('sync-server (jest)', report, r.code);
}

async function browserTests(settings, env) {
  const runner = path.join(repoRoot, 'scripts', 'e2e', 'run.mjs');
  heading('browser tests (Chromium)');
  // A throw-away database for the server under test, migrated and seeded like `npm start`.
  const e2eDb = { ...settings, database: `${settings.database}_e2e_${process.pid}` };
  await rootSql(`CREATE DATABASE IF NOT EXISTS \`${e2eDb.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const dropDb = () => rootSql(`DROP DATABASE IF EXISTS \`${e2eDb.database}\``);
  cleanups.push(dropDb);
  await dbTask('migrate', e2eDb);
  await dbTask('seed', e2eDb);
  const port = await freePort();
  const logFile = path.join(reportsDir, 'e2e-server.log');
  // Every browser test signs in from 127.0.0.1: lift the per-address limits (their own tests prove them).
  const limits = { PW_RATE_LIMIT_SIGN_IN: '10000', PW_RATE_LIMIT_REGISTER: '10000', PW_RATE_LIMIT_RESET: '10000' };
  const server = await startServer({ port, env: { ...env, ...limits, PW_DB_NAME: e2eDb.database }, logFile });
  cleanups.push(server.stop);
  info(`server under test at ${server.url} (log: ${path.relative(repoRoot, logFile)})`);
  try {
    const r = await run(process.execPath, [runner], { capture: true, echo: true, env: { ...process.env, PW_BASE_URL: server.url } });
    const m = /E2E: (\d+) passed, (\d+) failed/.exec(r.stdout);
    if (m) {
      let failed = Number(m[2]);
      if (r.code !== 0 && failed === 0) failed = 1;
      tally.add('browser (e2e)', Number(m[1]), failed);
    } else {
      tally.add('browser (e2e)', 0, 1, 0, `runner printed no "E2E:" line (exit ${r.code})`);
    }
  } finally {
    cleanups.splice(cleanups.indexOf(server.stop), 1);
    await server.stop();
    cleanups.splice(cleanups.indexOf(dropDb), 1);
    await dropDb();
  }
}

async function cleanUp() {
  for (const fn of cleanups.splice(0).reverse()) {
    try {
      await fn();
    } catch (err) {
      process.stderr.write(`[phasewright] clean-up: ${err.message}\n`);
    }
  }
}

const interrupt = (why) => {
  process.stderr.write(`\n[phasewright] ${why}: cleaning up…\n`);
  void cleanUp().then(() => process.exit(130));
};
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => interrupt(signal));
onParentExit(() => interrupt('npm was stopped'));

runMain(async () => {
  const t0 = Date.now();
  await ensureNodeModules();
  fs.mkdirSync(reportsDir, { recursive: true });

  // The database and Chromium (apt-get installs on a new machine, one after the other since apt
  // holds a lock) get ready in the background while the CPU-bound checks run.
  const hasBrowserTests = fs.existsSync(path.join(repoRoot, 'scripts', 'e2e', 'run.mjs'));
  const dbReady = startDatabase({ autoPort: true }).then(
    (db) => {
      if (db.startedHere) cleanups.push(() => stopDatabase());
      return db;
    },
    (err) => ({ err }),
  );
  const chromiumReady = dbReady.then(() => (hasBrowserTests ? ensureChromium() : undefined)).then(
    () => null,
    (err) => err,
  );

  await lint();
  await vitest('physics-core');
  await vitest('pwa');

  let built = true;
  heading('build (physics-core, pwa, sync-server)');
  try {
    await buildAll();
  } catch (err) {
    built = false;
    fromError('build', err);
  }

  heading('private MariaDB');
  const db = await dbReady;
  if (db.err) fromError('database', db.err);
  else {
    const s = db.settings;
    info(`tests use the database server on 127.0.0.1:${s.port}`);
    const env = {
      ...process.env,
      PW_DB_HOST: '127.0.0.1',
      PW_DB_PORT: String(s.port),
      PW_DB_NAME: s.database,
      PW_DB_USER: s.user,
      PW_DB_PASSWORD: s.password,
    };
    await serverTests(s, env);
    const chromiumError = await chromiumReady;
    if (!hasBrowserTests) info('scripts/e2e/run.mjs not found: browser tests skipped');
    else if (!built) fromError('browser (e2e)', new ScriptError('not run: the build failed'));
    else if (chromiumError) fromError('browser (e2e)', chromiumError);
    else {
      try {
        await browserTests(s, env);
      } catch (err) {
        fromError('browser (e2e)', err);
      }
    }
  }

  await cleanUp();
  const seconds = ((Date.now() - t0) / 1000).toFixed(1);
  process.stdout.write(`\n=== summary (${seconds} s) ===\n${tally.table()}\n${tally.summary()}\n`);
  process.exitCode = tally.failed > 0 ? 1 : 0;
});
