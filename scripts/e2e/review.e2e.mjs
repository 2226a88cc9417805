// The review journey in the browser, against the real server and MariaDB, with the seeded demo
// accounts (db/seeders/0001-demo-accounts.mjs: no registrations, so no registration rate limit):
//   the editor runs a small ED cut in the demo project, the map syncs, the editor requests a review
//   from the project's reviewer on the review page; the site admin reads the review-request e-mail
//   on the admin Mail page (the server's fake SMTP store); the reviewer (her own browser) follows
//   the e-mail's link, signs in, the map is fetched, she runs the spot-check in her browser and
//   approves; the editor sees the approval. Then the editor refines the sweep near the phase
//   boundary (new points in the same map, pushed by the sync engine): the verdict is now outdated,
//   and both the editor and the reviewer see that on the review page.
// Every step a person does happens in the page.
import assert from 'node:assert/strict';
import { randomBytes } from 'node:crypto';
import { launchFreshContext } from './browser.mjs';

const run = randomBytes(3).toString('hex');
const DEMO_PROJECT = 'Demo: kagome strip survey';
const EDITOR = { email: 'otto.vane@example.org', password: 'editor-pebble-4821', displayName: 'Otto Vane' };
const REVIEWER = { email: 'lena.quartz@example.org', password: 'review-thistle-4821', displayName: 'Lena Quartz' };
const ADMIN = { email: 'ada.quill@example.org', password: 'admin-lantern-4821', displayName: 'Ada Quill' };

/** @param {import('playwright-core').Page} page  `baseUrl` null: the sign-in form is already open. */
async function signIn(page, baseUrl, who) {
  if (baseUrl) await page.goto(`${baseUrl}/sign-in`);
  await page.locator('[data-path="email"]').fill(who.email);
  await page.locator('[data-path="password"]').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-user').filter({ hasText: who.displayName }).waitFor();
}

async function syncPhase(page, phase, timeout = 20_000) {
  await page.locator(`[data-testid="sync-badge"][data-phase="${phase}"]`).waitFor({ timeout });
}

/** @param {import('playwright-core').Page} page */
async function openDemoProject(page, baseUrl) {
  await page.goto(`${baseUrl}/projects`);
  await page.getByRole('link', { name: DEMO_PROJECT }).first().click();
  await page.getByRole('heading', { level: 1, name: DEMO_PROJECT }).waitFor();
  return page.url().match(/\/projects\/([0-9a-f-]{36})/)?.[1];
}

export const tests = [
  {
    name: 'review journey: editor requests a review, the reviewer follows the e-mailed link, spot-checks in her browser and approves; refined points make the verdict outdated',
    // Three browsers, two sweeps, a spot-check and several sync rounds: 26–38 s on this machine at load 2–4.
    timeoutMs: 120_000,
    async run({ baseUrl, page, screenshot }) {
      await signIn(page, baseUrl, EDITOR);
      const projectId = await openDemoProject(page, baseUrl);
      assert.ok(projectId, 'the demo project has an id in its address');
      await syncPhase(page, 'up-to-date');

      // A small ED cut in the demo project.
      await page.getByRole('link', { name: 'New model' }).last().click();
      await page.getByTestId('model-project').filter({ hasText: DEMO_PROJECT }).waitFor();
      await page.getByText('The model is valid.').waitFor();
      await page.locator('[data-path="$.name"]').fill(`review chain ${run}`);
      await page.getByRole('button', { name: 'Save model' }).click();
      await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
      await page.getByRole('button', { name: 'Sweep this model →' }).click();
      await page.getByRole('form', { name: 'Sweep' }).waitFor();
      await page.locator('[data-path="$.name"]').fill(`review cut ${run}`);
      await page.selectOption('[data-path="$.axes[0].parameter"]', 'V');
      await page.locator('[data-path="$.axes[0].from"]').fill('0');
      // 0 … 6 in 5 points: superfluid on the left, density wave on the right of the 8-site ring, so
      // that a refinement later adds a point between them.
      await page.locator('[data-path="$.axes[0].to"]').fill('6');
      await page.locator('[data-path="$.axes[0].points"]').fill('5');
      await page.getByText('5 coarse points').waitFor();
      await page.getByRole('button', { name: 'Create sweep and start' }).click();
      await page.waitForURL(/\/sweeps\//);
      await page.locator('[data-run-state="done"]').waitFor({ timeout: 30_000 });
      await page.getByRole('link', { name: 'Open the map' }).click();
      await page.waitForURL(/\/maps\//);
      await syncPhase(page, 'up-to-date', 40_000);
      await page.getByTestId('map-exports').waitFor();

      // Exports: the points CSV comes from the server with one line per point.
      const [csvDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-csv').click()]);
      assert.match(csvDownload.suggestedFilename(), /-points\.csv$/);
      const csvPath = await csvDownload.path();
      const { readFile } = await import('node:fs/promises');
      assert.equal((await readFile(csvPath, 'utf8')).trim().split(/\r?\n/).length, 6, 'header and 5 points');

      // Measured data: a CSV with a bad number is refused with its line; a good one is drawn on the cut.
      await page.getByTestId('measurements-file').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('V,energyPerSite,energyPerSite_err\n0,-0.65,0.01\n1,abc,0.01\n') });
      await page.getByTestId('measurements-upload').click();
      await page.getByTestId('measurements-error').filter({ hasText: 'line 3' }).waitFor();
      await screenshot('review-0-upload-error');
      await page.getByTestId('measurements-file').setInputFiles({ name: 'measured.csv', mimeType: 'text/csv', buffer: Buffer.from('V,energyPerSite,energyPerSite_err\n0,-0.64,0.02\n1.5,-0.45,0.015\n3,-0.34,0.01\n') });
      await page.getByTestId('measurements-upload').click();
      await page.getByTestId('measurements-summary').filter({ hasText: '3 rows' }).waitFor();
      await page.getByLabel('Cut observable').selectOption('energyPerSite');
      await page.locator('[data-testid="cut-measured"][data-count="3"]').waitFor();
      await screenshot('review-1-editor-map');

      // The editor asks the reviewer.
      await page.getByTestId('map-review-link').click();
      await page.waitForURL(/\/review$/);
      const reviewUrl = page.url();
      await page.getByTestId('provenance').waitFor();
      const option = page.getByTestId('review-reviewer').locator('option', { hasText: REVIEWER.displayName });
      await page.getByTestId('review-reviewer').selectOption(await option.getAttribute('value'));
      await page.getByTestId('review-message').fill('Please check the density-wave side of the cut.');
      await page.getByTestId('review-request-submit').click();
      await page.locator('[data-testid="review"][data-status="requested"]').waitFor();
      await screenshot('review-2-requested');

      // The site admin reads the review-request e-mail on the Mail page (the server's fake SMTP store).
      const adminBrowser = await launchFreshContext();
      let reviewLink;
      try {
        const apage = adminBrowser.context.pages()[0] ?? (await adminBrowser.context.newPage());
        await signIn(apage, baseUrl, ADMIN);
        await apage.getByRole('link', { name: 'Mail' }).click();
        await apage.getByRole('heading', { name: 'Captured mail' }).waitFor();
        await apage.getByRole('textbox', { name: 'Recipient filter' }).fill(REVIEWER.email);
        const message = apage.locator(`[data-mail-to="${REVIEWER.email}"]`).filter({ hasText: `review cut ${run}` }).first();
        await message.waitFor({ timeout: 15_000 });
        assert.match(await message.innerText(), /asks you to review/);
        reviewLink = await message.locator('[data-mail-link]').first().getAttribute('href');
        assert.ok(reviewLink, 'the e-mail carries a link');
        await message.scrollIntoViewIfNeeded();
        await screenshot('review-3-admin-mail', apage);
      } finally {
        await adminBrowser.close();
      }
      const reviewId = reviewLink.match(/\/reviews\/([0-9a-f-]{36})$/)?.[1];
      assert.ok(reviewId, `the link names a review: ${reviewLink}`);
      assert.ok(reviewLink.includes(reviewUrl.replace(/\/review$/, '').replace(baseUrl, '')), 'the link points at the same map');

      // The reviewer, in her own browser, follows the e-mail's link: sign in, the map is fetched, the review page.
      const other = await launchFreshContext();
      try {
        const rpage = other.context.pages()[0] ?? (await other.context.newPage());
        await rpage.goto(new URL(reviewLink, baseUrl).href);
        await rpage.getByTestId('review-sign-in').click();
        await signIn(rpage, null, REVIEWER);
        await rpage.waitForURL(new RegExp(`/reviews/${reviewId}$`));
        await rpage.getByTestId('provenance').waitFor({ timeout: 30_000 });
        // The run is recorded with its author (the editor was signed in when he ran it).
        await rpage.getByTestId('provenance').getByText(new RegExp(`^${EDITOR.displayName} · `)).first().waitFor();
        await rpage.locator('[data-testid="review"][data-status="requested"]').first().waitFor();
        await rpage.getByTestId('spot-check-sample').fill('3');
        const t0 = Date.now();
        await rpage.getByTestId('spot-check-run').click();
        const report = rpage.getByTestId('spot-check-report-browser');
        await report.waitFor({ timeout: 60_000 });
        const spotMs = Date.now() - t0;
        assert.equal(await report.getAttribute('data-pass'), 'true', 'the in-browser spot-check passes');
        await screenshot('review-4-spot-check', rpage);
        await rpage.getByTestId('verdict-approved').check();
        await rpage.getByTestId('verdict-note').fill(`Spot-check of 3 points reproduced the energies and labels (${(spotMs / 1000).toFixed(1)} s).`);
        await rpage.getByTestId('verdict-submit').click();
        await rpage.locator('[data-testid="review"][data-status="approved"][data-outdated="false"]').waitFor();
        await screenshot('review-5-approved', rpage);
        console.log(`     review journey: in-browser spot-check of 3 points took ${(spotMs / 1000).toFixed(1)} s`);

        // The editor sees the approval.
        await page.reload();
        await page.locator('[data-testid="review"][data-status="approved"][data-outdated="false"]').waitFor({ timeout: 15_000 });
        await page.getByTestId('review-verdict').filter({ hasText: 'approved' }).waitFor();
        await screenshot('review-6-editor-sees-approval');

        // The editor refines the sweep near the boundary: new points in the same map, pushed by the sync engine.
        await page.getByRole('link', { name: 'Back to the map' }).click();
        await page.getByRole('link', { name: 'The sweep and its run' }).click();
        await page.waitForURL(/\/sweeps\//);
        await page.locator('[data-run-state="done"]').waitFor();
        await page.locator('[data-path="$.refine.maxDepth"]').fill('1');
        await page.getByTestId('refine-run').click();
        // 5 stored points skipped, one new point between the last superfluid and the first density-wave point.
        await page.locator('[data-run-state="done"] [data-testid="points-done"]').filter({ hasText: /^6$/ }).waitFor({ timeout: 30_000 });
        await syncPhase(page, 'up-to-date', 40_000);
        await screenshot('review-7-refined');
        await page.getByRole('link', { name: 'Open the map' }).click();
        await page.locator('[data-testid="map-review-state"][data-state="outdated"]').waitFor({ timeout: 15_000 });
        await page.getByTestId('map-review-link').click();
        await page.waitForURL(/\/review$/);
        await page.locator('[data-testid="review"][data-status="approved"][data-outdated="true"]').waitFor({ timeout: 15_000 });
        await page.getByTestId('review-outdated-summary').waitFor();
        assert.match(await page.getByRole('heading', { level: 1 }).locator('..').innerText(), /6 points/, 'the refined map has one point more');
        await screenshot('review-8-editor-sees-outdated');

        // The project home filters by review state and author.
        await openDemoProject(page, baseUrl);
        const items = page.getByRole('list', { name: 'Items' });
        await page.getByRole('combobox', { name: 'Review state' }).selectOption('outdated');
        await items.locator('[data-kind="map"][data-review-state="outdated"]').filter({ hasText: `review cut ${run}` }).waitFor({ timeout: 15_000 });
        assert.equal(await items.locator('li:not([data-review-state="outdated"])').count(), 0, 'only maps with an outdated verdict are listed');
        await page.getByRole('combobox', { name: 'Review state' }).selectOption('approved');
        assert.equal(await items.getByRole('link', { name: `review cut ${run}` }).count(), 0, 'the map is no longer listed as approved');
        await page.getByRole('combobox', { name: 'Review state' }).selectOption('all');
        const author = page.getByRole('combobox', { name: 'Author' });
        await author.selectOption({ label: `by ${EDITOR.displayName} (me)` });
        await items.getByRole('link', { name: `review chain ${run}` }).waitFor();
        for (const text of await items.locator('li').allInnerTexts()) assert.match(text, new RegExp(`by ${EDITOR.displayName} \\(me\\)`));
        await page.getByRole('combobox', { name: 'Review state' }).selectOption('outdated');
        await screenshot('review-8b-project-filters');

        // The reviewer sees it too.
        await rpage.reload();
        await rpage.locator('[data-testid="review"][data-status="approved"][data-outdated="true"]').waitFor({ timeout: 15_000 });
        await rpage.getByTestId('review-outdated-summary').waitFor();
        // Her copy of the map gets the new point with the next sync round.
        await rpage.getByText(/· 6 points$/).waitFor({ timeout: 40_000 });
        await screenshot('review-9-reviewer-sees-outdated', rpage);
      } finally {
        await other.close();
      }
    },
  },
];
