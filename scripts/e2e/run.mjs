// Browser tests: runs every scripts/e2e/*.e2e.mjs against PW_BASE_URL in headless Chromium.
// Each file exports `tests`: an array of { name, run(t), timeoutMs? } (default 90 s or PW_TEST_TIMEOUT_MS: each step has its own wait, so this only stops a hang). Every test gets a fresh browser
// profile (no service worker or cache carried over). Screenshots go to <repo>/.screenshots/.
// Prints "ok"/"FAIL" per test and ends with "E2E: N passed, M failed"; exits 1 on failure.
//
//   PW_BASE_URL=http://127.0.0.1:8080 node scripts/e2e/run.mjs [filter]
import { mkdir, readdir } from 'node:fs/promises';
import { basename, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { launchFreshContext } from './browser.mjs';

const here = fileURLToPath(new URL('.', import.meta.url));
const repoRoot = join(here, '..', '..');
const screenshotDir = join(repoRoot, '.screenshots');
const TEST_TIMEOUT_MS = Number(process.env.PW_TEST_TIMEOUT_MS ?? 90_000);

const baseUrl = process.env.PW_BASE_URL?.replace(/\/+$/, '');
if (!baseUrl) {
  console.error('PW_BASE_URL is not set: point it at a running Phasewright server, e.g. PW_BASE_URL=http://127.0.0.1:8080');
  console.log('E2E: 0 passed, 1 failed');
  process.exit(1);
}
const filter = process.argv[2] ?? '';

await mkdir(screenshotDir, { recursive: true });

function withTimeout(promise, ms, what) {
  let timer;
  const timeout = new Promise((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} did not finish within ${ms} ms`)), ms);
  });
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer));
}

const files = (await readdir(here)).filter((name) => name.endsWith('.e2e.mjs')).sort();
let passed = 0;
let failed = 0;

for (const file of files) {
  const { tests } = await import(pathToFileURL(join(here, file)).href);
  if (!Array.isArray(tests)) {
    console.log(`FAIL ${file}: exports no "tests" array`);
    failed += 1;
    continue;
  }
  for (const test of tests) {
    const label = `${basename(file, '.e2e.mjs')} › ${test.name}`;
    if (filter && !label.includes(filter)) continue;
    const started = Date.now();
    let browser;
    let page;
    const pageErrors = [];
    try {
      browser = await launchFreshContext();
      page = browser.context.pages()[0] ?? (await browser.context.newPage());
      page.on('pageerror', (error) => pageErrors.push(error.message));
      const t = {
        baseUrl,
        context: browser.context,
        page,
        pageErrors,
        /** Saves a full-page PNG as .screenshots/<name>.png and returns its path. */
        screenshot: async (name, target = page) => {
          const path = join(screenshotDir, `${name}.png`);
          await target.screenshot({ path, fullPage: true });
          return path;
        },
      };
      await withTimeout(Promise.resolve(test.run(t)), test.timeoutMs ?? TEST_TIMEOUT_MS, label);
      if (pageErrors.length > 0) throw new Error(`uncaught errors in the page: ${pageErrors.join(' | ')}`);
      passed += 1;
      console.log(`ok   ${label} (${Date.now() - started} ms)`);
    } catch (error) {
      failed += 1;
      console.log(`FAIL ${label} (${Date.now() - started} ms)`);
      console.log(`     ${(error instanceof Error ? error.message : String(error)).split('\n').join('\n     ')}`);
      if (page && !page.isClosed()) {
        const slug = label.replace(/[^a-z0-9]+/gi, '-').toLowerCase();
        const path = join(screenshotDir, `FAIL-${slug}.png`);
        await page.screenshot({ path, fullPage: true }).then(
          () => console.log(`     screenshot: ${path}`),
          () => {},
        );
      }
    } finally {
      await browser?.close();
    }
  }
}

if (passed + failed === 0) {
  console.log(filter ? `no browser test matches "${filter}"` : 'no browser tests found');
  failed = filter ? 0 : 1;
}
console.log(`E2E: ${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
