// The app shell loads, its service worker takes control, and the shell still opens offline.
import assert from 'node:assert/strict';

/** @param {import('playwright-core').Page} page */
async function expectShell(page) {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.getByRole('link', { name: 'Home' }).waitFor({ state: 'visible' });
  await nav.getByRole('link', { name: 'Status' }).waitFor({ state: 'visible' });
  const footer = await page.getByTestId('core-version').textContent();
  assert.match(footer ?? '', /^physics-core v\d+\.\d+\.\d+/, 'footer shows the physics-core version');
}

export const tests = [
  {
    name: 'shell renders, the service worker takes control, and an offline reload still renders the shell',
    async run({ baseUrl, context, page, screenshot }) {
      await page.goto(`${baseUrl}/`);
      await expectShell(page);
      assert.match(await page.title(), /Phasewright/);
      await page.getByRole('heading', { level: 1 }).waitFor();

      const manifest = await page.evaluate(async () => {
        const link = document.querySelector('link[rel="manifest"]');
        if (!link) return null;
        return (await fetch(link.getAttribute('href') ?? '')).json();
      });
      assert.ok(manifest, 'index.html links a web app manifest');
      assert.equal(manifest.name, 'Phasewright');
      assert.ok(manifest.icons.some((icon) => icon.sizes === '512x512'), 'manifest has a 512×512 icon');

      // The first visit installs the worker (precaching the shell and fonts) and activates it.
      const state = await page.evaluate(async () => {
        const registration = await navigator.serviceWorker.ready;
        const worker = registration.active;
        if (worker && worker.state !== 'activated') {
          await new Promise((resolve) => worker.addEventListener('statechange', () => worker.state === 'activated' && resolve(undefined)));
        }
        return { scope: registration.scope, state: registration.active?.state };
      });
      assert.equal(state.state, 'activated');
      assert.equal(state.scope, `${baseUrl}/`);

      // After a reload the page is controlled by the worker.
      await page.reload();
      await expectShell(page);
      const controlled = await page.evaluate(() => navigator.serviceWorker.controller?.state ?? null);
      assert.equal(controlled, 'activated', 'the reloaded page is controlled by the service worker');
      await screenshot('home');

      // Client-side navigation to the status page, then the network goes away: the open page
      // hears the 'offline' event and says so in the header and on the status page.
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Status' }).click();
      await page.getByRole('heading', { level: 1, name: 'Status' }).waitFor();
      await context.setOffline(true);
      await page.getByRole('banner').getByText('Offline', { exact: true }).waitFor({ state: 'visible' });
      await page.locator('[data-health="connection"][data-state="offline"]').getByText('You are offline').waitFor();
      await screenshot('status-offline');

      // Reload offline: /status is not a file, so the worker answers with the cached
      // index.html (navigateFallback); the shell, its code and the font files come from the
      // precache. (After a reload Chromium's emulation keeps the network down but may report
      // navigator.onLine as true again, so the test proves the network is down by fetching.)
      await page.reload();
      await expectShell(page);
      await page.getByRole('heading', { level: 1, name: 'Status' }).waitFor();
      await page.locator('[data-health="connection"]').waitFor({ state: 'visible' });
      const networkDown = await page.evaluate(() =>
        fetch(`/api/health?probe=${Date.now()}`).then(
          () => false,
          () => true,
        ),
      );
      assert.ok(networkDown, 'a request that no cache holds fails: the network is really off');
      const manrope = await page.evaluate(async () => {
        await document.fonts.ready;
        return [...document.fonts].filter((face) => face.family.includes('Manrope')).map((face) => face.status);
      });
      assert.ok(manrope.includes('loaded'), `Manrope loaded offline (font faces: ${manrope.join(', ') || 'none'})`);
      assert.ok(!manrope.includes('error'), `no Manrope face failed offline (${manrope.join(', ')})`);

      // The start page opens offline too.
      await page.goto(`${baseUrl}/`);
      await expectShell(page);
      await page.getByRole('heading', { level: 1 }).waitFor();
      await screenshot('home-offline');
    },
  },
  {
    name: 'an unknown path shows the 404 page inside the shell',
    async run({ baseUrl, page, screenshot }) {
      const response = await page.goto(`${baseUrl}/no/such/page`);
      assert.ok(response && response.ok(), `history fallback answers 200 for client routes (got ${response?.status()})`);
      await expectShell(page);
      await page.getByRole('heading', { name: 'No page here' }).waitFor();
      await screenshot('not-found');
    },
  },
];
