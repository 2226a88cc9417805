// Migrate and seed through db/cli.mjs (needs node_modules: umzug and sequelize).
import path from 'node:path';
import { ScriptError } from './log.mjs';
import { dbEnv } from './db.mjs';
import { repoRoot } from './paths.mjs';
import { run } from './proc.mjs';

const cli = path.join(repoRoot, 'db', 'cli.mjs');

/** @returns {Promise<any>} the JSON line db/cli.mjs prints */
export async function dbTask(command, settings) {
  const r = await run(process.execPath, [cli, command], {
    capture: true,
    env: { ...process.env, ...dbEnv(settings) },
  });
  if (r.code !== 0) {
    throw new ScriptError(`database ${command} failed: ${r.stderr.trim().split('\n').pop()}`, r.stderr);
  }
  return JSON.parse(r.stdout.trim().split('\n').pop());
}
