// Where things live in this checkout. Plain Node (no dependencies): these helpers run before `npm ci`.
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** Root of this checkout (the folder holding the root package.json). */
export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

/** Per-checkout runtime state, ignored by git. */
export const dataDir = path.join(repoRoot, '.data');
export const mariadbDataDir = path.join(dataDir, 'mariadb');
export const runDir = path.join(dataDir, 'run');
export const dbSocket = path.join(runDir, 'mariadb.sock');
export const dbPidFile = path.join(runDir, 'mariadb.pid');
export const dbErrorLog = path.join(runDir, 'error.log');
/** Credentials and port of this checkout's database (written by db-start, read by scripts and tests). */
export const dbStateFile = path.join(dataDir, 'db.json');
/** MariaDB settings shared by every checkout (paths and port are added on the command line). */
export const myCnf = path.join(repoRoot, 'db', 'my.cnf');
