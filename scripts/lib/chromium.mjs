// Debian's Chromium for the browser tests (never a browser download: it cannot work here).
import fs from 'node:fs';
import { ScriptError, info } from './log.mjs';
import { run, which } from './proc.mjs';

export const CHROMIUM = process.env.PW_CHROMIUM || '/usr/bin/chromium';

export async function ensureChromium() {
  if (fs.existsSync(CHROMIUM)) return;
  if (!which('apt-get')) {
    throw new ScriptError(`Chromium is missing at ${CHROMIUM} and apt-get is not available; install Chromium and set PW_CHROMIUM to its path`);
  }
  info('chromium not found: installing it with apt-get (about 30 s)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  let r = await run('apt-get', ['install', '-y', '-q', 'chromium'], { env, capture: true });
  if (r.code !== 0) {
    await run('apt-get', ['update', '-q'], { env, capture: true });
    r = await run('apt-get', ['install', '-y', '-q', 'chromium'], { env, capture: true });
  }
  if (r.code !== 0 || !fs.existsSync(CHROMIUM)) {
    throw new ScriptError(
      'apt-get install chromium failed; run `apt-get update && apt-get install -y chromium` as root, then retry',
      `${r.stdout}${r.stderr}`.trim().split('\n').slice(-8).join('\n'),
    );
  }
}
