// The private MariaDB of this checkout: install, initialise once, start, provision, stop.
// Plain Node without dependencies (runs before `npm ci`).
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import { ScriptError, info } from './log.mjs';
import {
  dataDir,
  dbErrorLog,
  dbPidFile,
  dbSocket,
  dbStateFile,
  mariadbDataDir,
  myCnf,
  runDir,
} from './paths.mjs';
import { canBind, freePort, isListening, portFromEnv } from './ports.mjs';
import { run, which } from './proc.mjs';

export const DEFAULT_DB_PORT = 3307;
const DEFAULT_DB_NAME = 'phasewright';
const DEFAULT_DB_USER = 'phasewright';

const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/** @returns {{port?: number, user?: string, password?: string, database?: string, pid?: number}} */
export function readDbState() {
  try {
    return JSON.parse(fs.readFileSync(dbStateFile, 'utf8'));
  } catch {
    return {};
  }
}

function writeDbState(state) {
  fs.mkdirSync(dataDir, { recursive: true });
  fs.writeFileSync(dbStateFile, `${JSON.stringify(state, null, 2)}\n`, { mode: 0o600 });
}

/** Environment variables the server, migrations and tests read to reach this database. */
export function dbEnv(settings) {
  return {
    PW_DB_HOST: '127.0.0.1',
    PW_DB_PORT: String(settings.port),
    PW_DB_NAME: settings.database,
    PW_DB_USER: settings.user,
    PW_DB_PASSWORD: settings.password,
  };
}

function findBinary(name) {
  return which(name) ?? (fs.existsSync(`/usr/sbin/${name}`) ? `/usr/sbin/${name}` : null) ??
    (fs.existsSync(`/usr/bin/${name}`) ? `/usr/bin/${name}` : null);
}

/** Install Debian's mariadb-server when `mariadbd` is missing. */
export async function ensureMariadbInstalled() {
  if (findBinary('mariadbd')) return;
  if (!which('apt-get')) {
    throw new ScriptError('mariadbd is not installed and apt-get is not available; install MariaDB server 10.11+ and make sure `mariadbd` is on PATH');
  }
  info('mariadbd not found: installing mariadb-server with apt-get (about 20 s)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  let result = await run('apt-get', ['install', '-y', '-q', 'mariadb-server'], { env, capture: true });
  if (result.code !== 0) {
    // Package lists may be missing or stale on a new machine: refresh once and retry.
    await run('apt-get', ['update', '-q'], { env, capture: true });
    result = await run('apt-get', ['install', '-y', '-q', 'mariadb-server'], { env, capture: true });
  }
  if (result.code !== 0 || !findBinary('mariadbd')) {
    const tail = `${result.stdout}${result.stderr}`.trim().split('\n').slice(-8).join('\n');
    throw new ScriptError(
      'apt-get install mariadb-server failed; run `apt-get update && apt-get install -y mariadb-server` as root (check network access to the Debian mirror), then retry',
      tail,
    );
  }
}

function pidAlive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return err.code === 'EPERM';
  }
}

/** PID of this checkout's running mariadbd, or null (a stale pid file is ignored). */
export function ourRunningPid() {
  let pid;
  try {
    pid = Number(fs.readFileSync(dbPidFile, 'utf8').trim());
  } catch {
    return null;
  }
  if (!Number.isInteger(pid) || pid <= 0 || !pidAlive(pid)) return null;
  try {
    // Guard against a recycled pid: the process must be a mariadbd using this checkout's datadir.
    const cmdline = fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8');
    if (!cmdline.includes(mariadbDataDir)) return null;
  } catch {
    // No /proc (not Linux): trust the pid file.
  }
  return pid;
}

async function ping() {
  const admin = findBinary('mariadb-admin') ?? 'mariadb-admin';
  const r = await run(admin, ['--no-defaults', `--socket=${dbSocket}`, '-uroot', '--connect-timeout=1', 'ping'], {
    capture: true,
  });
  return r.code === 0;
}

function errorLogTail(lines = 15) {
  try {
    const text = fs.readFileSync(dbErrorLog, 'utf8').trimEnd().split('\n');
    return `--- last lines of ${dbErrorLog} ---\n${text.slice(-lines).join('\n')}`;
  } catch {
    return `(no error log at ${dbErrorLog})`;
  }
}

async function initialiseDataDir() {
  if (fs.existsSync(`${mariadbDataDir}/mysql`)) return;
  info(`initialising the database folder ${mariadbDataDir} (first run only)…`);
  // A half-made folder from an interrupted first run would make mariadb-install-db refuse.
  fs.rmSync(mariadbDataDir, { recursive: true, force: true });
  fs.mkdirSync(mariadbDataDir, { recursive: true });
  const installDb = findBinary('mariadb-install-db') ?? 'mariadb-install-db';
  const r = await run(
    installDb,
    [
      `--defaults-file=${myCnf}`,
      '--user=root',
      `--datadir=${mariadbDataDir}`,
      '--auth-root-authentication-method=socket',
      '--skip-test-db',
    ],
    { capture: true },
  );
  if (r.code !== 0) {
    fs.rmSync(mariadbDataDir, { recursive: true, force: true });
    const tail = `${r.stdout}${r.stderr}`.trim().split('\n').slice(-12).join('\n');
    throw new ScriptError('mariadb-install-db could not initialise .data/mariadb; read the output above, fix the cause and run the command again', tail);
  }
}

function sqlString(value) {
  return `'${String(value).replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

function sqlIdent(value) {
  if (!/^[A-Za-z0-9_]+$/.test(value)) {
    throw new ScriptError(`database/user name "${value}" may contain only letters, digits and _; change PW_DB_NAME / PW_DB_USER`);
  }
  return `\`${value}\``;
}

/** Run SQL as root through the socket. */
export async function rootSql(sql) {
  const client = findBinary('mariadb') ?? 'mariadb';
  const r = await run(client, ['--no-defaults', `--socket=${dbSocket}`, '-uroot', '-e', sql], { capture: true });
  if (r.code !== 0) throw new ScriptError(`SQL as root failed: ${r.stderr.trim().split('\n').pop()}`);
  return r.stdout;
}

async function provision(settings) {
  const db = sqlIdent(settings.database);
  sqlIdent(settings.user);
  const user = sqlString(settings.user);
  const pass = sqlString(settings.password);
  // The app user owns every database whose name starts with the app database's name, so test
  // runs can create and drop their own (e.g. phasewright_test_1234).
  const pattern = `\`${settings.database.replace(/_/g, '\\_')}%\``;
  const statements = [
    `CREATE DATABASE IF NOT EXISTS ${db} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
  ];
  for (const host of ["'127.0.0.1'", "'localhost'"]) {
    statements.push(
      `CREATE USER IF NOT EXISTS ${user}@${host} IDENTIFIED BY ${pass}`,
      `ALTER USER ${user}@${host} IDENTIFIED BY ${pass}`,
      `GRANT ALL PRIVILEGES ON ${pattern}.* TO ${user}@${host}`,
    );
  }
  await rootSql(`${statements.join(';\n')};`);
}

/**
 * Settings for this checkout's database: environment first, then what db-start stored in
 * .data/db.json, then defaults (the password is generated once and stored there). The stored
 * port is that of the running instance; a new start uses PW_DB_PORT or 3307.
 */
export function resolveDbSettings(env = process.env) {
  const state = readDbState();
  return {
    port: portFromEnv('PW_DB_PORT', DEFAULT_DB_PORT, env),
    portFromEnv: Boolean(env.PW_DB_PORT),
    database: env.PW_DB_NAME || state.database || DEFAULT_DB_NAME,
    user: env.PW_DB_USER || state.user || DEFAULT_DB_USER,
    password: env.PW_DB_PASSWORD || state.password || randomBytes(18).toString('hex'),
  };
}

/**
 * Start (or reuse) this checkout's database and make sure the app database and user exist.
 * @param {{autoPort?: boolean, timeoutS?: number}} [opts] autoPort: when the port is taken by
 *   another program and PW_DB_PORT was not set, pick a free port instead of stopping.
 * @returns {Promise<{settings: object, startedHere: boolean}>}
 */
export async function startDatabase(opts = {}) {
  const settings = resolveDbSettings();
  await ensureMariadbInstalled();

  const runningPid = ourRunningPid();
  if (runningPid) {
    const state = readDbState();
    if (settings.portFromEnv && state.port && state.port !== settings.port) {
      throw new ScriptError(
        `this checkout's database already runs on port ${state.port}, not PW_DB_PORT=${settings.port}; run \`npm run db:stop\` first or unset PW_DB_PORT`,
      );
    }
    settings.port = state.port ?? settings.port;
    if (await ping()) {
      await provision(settings);
      writeDbState({ ...state, ...pick(settings), pid: runningPid });
      info(`database already running (pid ${runningPid}, 127.0.0.1:${settings.port})`);
      return { settings, startedHere: false };
    }
    throw new ScriptError(
      `this checkout's mariadbd (pid ${runningPid}) is running but does not answer; run \`npm run db:stop\` and try again`,
      errorLogTail(),
    );
  }

  // The requested port must be free (another checkout's database or any other program may hold it).
  if ((await isListening(settings.port)) || !(await canBind(settings.port))) {
    if (opts.autoPort && !settings.portFromEnv) {
      const other = await freePort();
      info(`port ${settings.port} is taken by another program; this checkout's database uses port ${other} instead`);
      settings.port = other;
    } else {
      throw new ScriptError(
        `port ${settings.port} on 127.0.0.1 is in use by another program (not this checkout's database); stop that program or choose another port, e.g. PW_DB_PORT=${settings.port + 1} npm start`,
      );
    }
  }

  fs.mkdirSync(runDir, { recursive: true });
  await initialiseDataDir();
  fs.rmSync(dbSocket, { force: true });
  fs.rmSync(dbPidFile, { force: true });
  // One log per start (the previous one kept as error.log.1), so a failure shows its own lines.
  if (fs.existsSync(dbErrorLog)) fs.renameSync(dbErrorLog, `${dbErrorLog}.1`);

  const mariadbd = findBinary('mariadbd') ?? 'mariadbd';
  const child = spawn(
    mariadbd,
    [
      `--defaults-file=${myCnf}`,
      '--user=root',
      `--datadir=${mariadbDataDir}`,
      `--socket=${dbSocket}`,
      `--pid-file=${dbPidFile}`,
      `--log-error=${dbErrorLog}`,
      `--port=${settings.port}`,
    ],
    { detached: true, stdio: 'ignore' },
  );
  let exited = null;
  child.on('exit', (code, signal) => {
    exited = signal ?? code;
  });
  child.on('error', (err) => {
    exited = err.message;
  });
  child.unref();

  const timeoutS = opts.timeoutS ?? Number(process.env.PW_DB_START_TIMEOUT_S || 60);
  const deadline = Date.now() + timeoutS * 1000;
  for (;;) {
    if (await ping()) break;
    if (exited !== null) {
      throw new ScriptError(`mariadbd stopped during start-up (${exited}); read the log above, fix the cause and run the command again`, errorLogTail());
    }
    if (Date.now() > deadline) {
      try {
        process.kill(child.pid, 'SIGTERM');
      } catch {
        /* already gone */
      }
      throw new ScriptError(
        `MariaDB did not answer within ${timeoutS} s; read ${dbErrorLog} (tail above), or allow more time with PW_DB_START_TIMEOUT_S=120`,
        errorLogTail(),
      );
    }
    await sleep(100);
  }
  await provision(settings);
  writeDbState({ ...pick(settings), pid: child.pid });
  info(`database up on 127.0.0.1:${settings.port} (pid ${child.pid}, data in .data/mariadb)`);
  return { settings, startedHere: true };
}

function pick(settings) {
  return { port: settings.port, database: settings.database, user: settings.user, password: settings.password };
}

/** Shut this checkout's database down cleanly; resolves true when one was running. */
export async function stopDatabase(timeoutS = 30) {
  const pid = ourRunningPid();
  if (!pid) return false;
  const admin = findBinary('mariadb-admin') ?? 'mariadb-admin';
  await run(admin, ['--no-defaults', `--socket=${dbSocket}`, '-uroot', '--connect-timeout=2', 'shutdown'], {
    capture: true,
  });
  const deadline = Date.now() + timeoutS * 1000;
  let signalled = false;
  while (pidAlive(pid)) {
    if (Date.now() > deadline) {
      if (signalled) throw new ScriptError(`mariadbd (pid ${pid}) did not stop; end it with \`kill ${pid}\``);
      process.kill(pid, 'SIGTERM');
      signalled = true;
    }
    await sleep(100);
  }
  return true;
}
