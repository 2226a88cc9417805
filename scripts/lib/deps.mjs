// npm dependencies: install from the lock file when node_modules is missing.
import fs from 'node:fs';
import path from 'node:path';
import { info } from './log.mjs';
import { repoRoot } from './paths.mjs';
import { mustRun, npmCmd } from './proc.mjs';

export async function ensureNodeModules() {
  if (fs.existsSync(path.join(repoRoot, 'node_modules', '.package-lock.json'))) return;
  info('node_modules missing: running npm ci (about a minute on a new machine)…');
  await mustRun('npm ci', npmCmd, ['ci', '--no-audit', '--no-fund']);
}
