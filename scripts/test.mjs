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
import { buildWorkspaces } from './lib/build.mjs';
import { ensureChromium } from './lib/chromium.mjs';
import { rootSql, startDatabase, stopDatabase } from './lib/db.mjs';
import { dbTask } from './lib/db-tasks.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { info, runMain, ScriptError } from './lib/log.mjs';
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

async function lint() {
  heading('lint');
  const hasEslintConfig = ['eslint.config.js', 'eslint.config.mjs', 'eslint.config.cjs', 'eslint.config.ts'].some((f) =>
    fs.existsSync(path.join(repoRoot, f)),
  );
  if (hasEslintConfig) {
    const r = await run('npx', ['eslint', '.']);
    tally.add('eslint', r.code === 0 ? 1 : 0, r.code === 0 ? 0 : 1);
  } else {
    info('no eslint.config.* at the root: eslint skipped');
  }
  for (const ws of WORKSPACES) {
    if (!workspaceScripts(ws).typecheck) continue;
    tally.mark();
    const r = await run(npmCmd, ['run', 'typecheck', '-w', ws]);
    tally.add(`typecheck ${ws}`, r.code === 0 ? 1 : 0, r.code === 0 ? 0 : 1);
  }
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
  if (!fs.existsSync(runner)) {
    info('scripts/e2e/run.mjs not found: browser tests skipped');
    return;
  }
  heading('browser tests (Chromium)');
  await ensureChromium();
  // A throw-away database for the server under test, migrated and seeded like `npm start`.
  const e2eDb = { ...settings, database: `${settings.database}_e2e_${process.pid}` };
  await rootSql(`CREATE DATABASE IF NOT EXISTS \`${e2eDb.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const dropDb = () => rootSql(`DROP DATABASE IF EXISTS \`${e2eDb.database}\``);
  cleanups.push(dropDb);
  await dbTask('migrate', e2eDb);
  await dbTask('seed', e2eDb);
  const port = await freePort();
  const logFile = path.join(reportsDir, 'e2e-server.log');
  const server = await startServer({ port, env: { ...env, PW_DB_NAME: e2eDb.database }, logFile });
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

for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    process.stderr.write(`\n[phasewright] ${signal}: cleaning up…\n`);
    void cleanUp().then(() => process.exit(130));
  });
}

runMain(async () => {
  const t0 = Date.now();
  await ensureNodeModules();
  fs.mkdirSync(reportsDir, { recursive: true });

  await lint();
  await vitest('physics-core');
  await vitest('pwa');

  let built = true;
  heading('build (physics-core, pwa, sync-server)');
  try {
    await buildWorkspaces(WORKSPACES);
  } catch (err) {
    built = false;
    fromError('build', err);
  }

  let db = null;
  try {
    heading('private MariaDB');
    db = await startDatabase({ autoPort: true });
    if (db.startedHere) cleanups.push(() => stopDatabase());
  } catch (err) {
    fromError('database', err);
  }
  if (db) {
    const s = db.settings;
    const env = {
      ...process.env,
      PW_DB_HOST: '127.0.0.1',
      PW_DB_PORT: String(s.port),
      PW_DB_NAME: s.database,
      PW_DB_USER: s.user,
      PW_DB_PASSWORD: s.password,
    };
    await serverTests(s, env);
    if (built) {
      try {
        await browserTests(s, env);
      } catch (err) {
        fromError('browser (e2e)', err);
      }
    } else {
      info('browser tests skipped: the build failed');
    }
  }

  await cleanUp();
  const seconds = ((Date.now() - t0) / 1000).toFixed(1);
  process.stdout.write(`\n=== summary (${seconds} s) ===\n${tally.table()}\n${tally.summary()}\n`);
  process.exitCode = tally.failed > 0 ? 1 : 0;
});
