// Start the built sync-server as a child process and wait until /api/health answers.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ScriptError } from './log.mjs';
import { repoRoot } from './paths.mjs';

export const serverMain = path.join(repoRoot, 'sync-server', 'dist', 'src', 'main.js');

const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/**
 * @param {{ port: number, env: Record<string,string>, logFile?: string, timeoutS?: number }} opts
 *   logFile: send the server's output there instead of this terminal.
 */
export async function startServer(opts) {
  const url = `http://127.0.0.1:${opts.port}`;
  let stdio = 'inherit';
  let logFd;
  if (opts.logFile) {
    fs.mkdirSync(path.dirname(opts.logFile), { recursive: true });
    logFd = fs.openSync(opts.logFile, 'w');
    stdio = ['ignore', logFd, logFd];
  }
  // `node path/to/main.js` so the recorded pid is the server's own.
  const child = spawn(process.execPath, [serverMain], {
    cwd: repoRoot,
    env: { ...process.env, ...opts.env, PW_PORT: String(opts.port), PW_HOST: '127.0.0.1' },
    stdio,
  });
  if (logFd !== undefined) fs.closeSync(logFd);
  let exit = null;
  const exited = new Promise((resolve) => {
    child.on('exit', (code, signal) => {
      exit = { code, signal };
      resolve(exit);
    });
  });

  const deadline = Date.now() + (opts.timeoutS ?? 30) * 1000;
  for (;;) {
    if (exit) {
      const tail = opts.logFile ? fs.readFileSync(opts.logFile, 'utf8').trim().split('\n').slice(-15).join('\n') : undefined;
      throw new ScriptError(`the server stopped during start-up (exit ${exit.code ?? exit.signal}); see the lines above`, tail);
    }
    try {
      const res = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) });
      if (res.ok) {
        const health = await res.json();
        return { child, url, health, exited, stop: () => stopChild(child, exited) };
      }
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) {
      child.kill('SIGTERM');
      throw new ScriptError(`the server did not answer ${url}/api/health within ${opts.timeoutS ?? 30} s`);
    }
    await sleep(150);
  }
}

/** SIGTERM, wait up to 10 s, then SIGKILL. */
export async function stopChild(child, exited) {
  if (child.exitCode !== null || child.signalCode !== null) return;
  child.kill('SIGTERM');
  const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
  await exited;
  clearTimeout(timer);
}
