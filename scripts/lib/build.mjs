// Build the workspaces the server needs, skipping any whose output is newer than its inputs.
import fs from 'node:fs';
import path from 'node:path';
import { ScriptError, info } from './log.mjs';
import { repoRoot } from './paths.mjs';
import { run, npmCmd } from './proc.mjs';

/** Inputs (files or folders) and the one output file whose age tells if a build is current. */
const TARGETS = {
  'physics-core': {
    inputs: ['physics-core/src', 'physics-core/cli', 'physics-core/package.json', 'physics-core/tsconfig.json', 'physics-core/tsconfig.build.json'],
    output: 'physics-core/dist/src/index.js',
  },
  pwa: {
    inputs: ['pwa/src', 'pwa/public', 'pwa/index.html', 'pwa/package.json', 'pwa/vite.config.ts', 'pwa/tsconfig.json', 'physics-core/src'],
    output: 'pwa/dist/index.html',
  },
  'sync-server': {
    inputs: ['sync-server/src', 'sync-server/package.json', 'sync-server/tsconfig.json', 'sync-server/tsconfig.build.json', 'physics-core/src'],
    output: 'sync-server/dist/src/main.js',
  },
};

function newestMtime(p) {
  let stat;
  try {
    stat = fs.statSync(p);
  } catch {
    return 0;
  }
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(p)) {
    if (entry === 'node_modules' || entry === 'dist') continue;
    newest = Math.max(newest, newestMtime(path.join(p, entry)));
  }
  return newest;
}

function isCurrent(target) {
  const out = path.join(repoRoot, target.output);
  if (!fs.existsSync(out)) return false;
  const inputs = Math.max(...target.inputs.map((i) => newestMtime(path.join(repoRoot, i))));
  return fs.statSync(out).mtimeMs >= inputs;
}

/**
 * Build workspaces in order (physics-core first: the server's build uses its dist).
 * PW_REBUILD=1 forces every build. Throws a ScriptError naming the workspace that failed.
 */
export async function buildWorkspaces(names = ['physics-core', 'pwa', 'sync-server'], opts = {}) {
  for (const name of names) {
    const target = TARGETS[name];
    if (!process.env.PW_REBUILD && isCurrent(target)) {
      info(`${name}: build is current`);
      continue;
    }
    info(`building ${name}…`);
    const t0 = Date.now();
    const r = await run(npmCmd, ['run', 'build', '-w', name], { capture: true, echo: opts.echo ?? false });
    if (r.code !== 0) {
      throw new ScriptError(
        `building ${name} failed; run \`npm run build -w ${name}\` to see the full output and fix the errors`,
        `${r.stdout}${r.stderr}`.trim().split('\n').slice(-25).join('\n'),
      );
    }
    // vite/tsc may leave the output's mtime untouched when nothing changed: mark it current.
    const out = path.join(repoRoot, target.output);
    if (fs.existsSync(out)) {
      const now = new Date();
      fs.utimesSync(out, now, now);
    }
    info(`built ${name} in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
  }
}

/** physics-core then sync-server (it needs physics-core's dist), and beside them the PWA (it reads physics-core's source). */
export async function buildAll() {
  const results = await Promise.allSettled([
    buildWorkspaces(['pwa']),
    buildWorkspaces(['physics-core', 'sync-server']),
  ]);
  for (const r of results) if (r.status === 'rejected') throw r.reason;
}
