// Child processes: run to completion, or capture output.
import { spawn, spawnSync } from 'node:child_process';
import { ScriptError } from './log.mjs';
import { repoRoot } from './paths.mjs';

/**
 * Run a command with inherited stdio; resolves with the exit code (never throws on non-zero).
 * @param {string} cmd @param {string[]} args @param {{cwd?: string, env?: NodeJS.ProcessEnv, capture?: boolean}} [opts]
 * @returns {Promise<{code: number, stdout: string, stderr: string}>}
 */
export function run(cmd, args, opts = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, {
      cwd: opts.cwd ?? repoRoot,
      env: opts.env ?? process.env,
      stdio: opts.capture ? ['ignore', 'pipe', 'pipe'] : ['ignore', 'inherit', 'inherit'],
    });
    let stdout = '';
    let stderr = '';
    if (opts.capture) {
      child.stdout.on('data', (d) => {
        stdout += d;
        if (opts.echo) process.stdout.write(d);
      });
      child.stderr.on('data', (d) => {
        stderr += d;
        if (opts.echo) process.stderr.write(d);
      });
    }
    child.on('error', (err) => reject(new ScriptError(`could not run ${cmd}: ${err.message}`)));
    child.on('close', (code, signal) => resolve({ code: code ?? (signal ? 128 : 1), stdout, stderr }));
  });
}

/** Run and throw a ScriptError naming the step when the exit code is non-zero. */
export async function mustRun(step, cmd, args, opts = {}) {
  const result = await run(cmd, args, opts);
  if (result.code !== 0) {
    const detail = opts.capture ? `${result.stdout}${result.stderr}`.split('\n').slice(-20).join('\n') : undefined;
    throw new ScriptError(`${step} failed (${cmd} ${args.join(' ')} exited with ${result.code})`, detail);
  }
  return result;
}

/** Is an executable on PATH (or at an absolute path)? */
export function which(cmd) {
  const r = spawnSync('sh', ['-c', `command -v ${cmd}`], { encoding: 'utf8' });
  return r.status === 0 ? r.stdout.trim() : null;
}

export const npmCmd = process.platform === 'win32' ? 'npm.cmd' : 'npm';
