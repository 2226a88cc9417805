// Launches Debian's Chromium through playwright-core with the flags that work on a closed
// network (see the stack notes). Shared by the e2e runner and pwa/scripts/make-icons.mjs.
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';

export const CHROMIUM_PATH = process.env.PW_CHROMIUM ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/**
 * A fresh headless Chromium profile in a temporary folder. `close()` shuts the browser and
 * removes the profile. Throws one clear line when the browser is missing.
 * @param {import('playwright-core').BrowserContextOptions} [options]
 */
export async function launchFreshContext(options = {}) {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `Chromium not found at ${CHROMIUM_PATH}: install it with "apt-get install -y chromium" (or set PW_CHROMIUM).`,
    );
  }
  const profileDir = await mkdtemp(join(tmpdir(), 'phasewright-chromium-'));
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: 1280, height: 860 },
    ...options,
  });
  return {
    context,
    async close() {
      await context.close().catch(() => {});
      await rm(profileDir, { recursive: true, force: true });
    },
  };
}
