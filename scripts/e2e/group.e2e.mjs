// The group side in the browser, against the real server and MariaDB:
//   1. An owner creates a project and invites a collaborator by e-mail from the members page; a
//      site admin opens the captured message on the admin Mail page; the invitee follows its
//      link, registers and sees the project; the owner sees the new member and changes the role.
//   3. Compare: an ED cut and a mean-field cut of one model, side by side, difference map, overlay.
//   2. The offline journey: the editor goes offline, creates a model and runs a sweep in the
//      shared project, reloads while still offline (app and map are there), comes back online and
//      the map syncs; another member pulls it and sees the same identity, point count and digest.
//   4. Conflict journey (see the test).
//   5. A new version while a change is being pushed: the browser reaches the server through a small
//      proxy of the test that can "deploy" a new service worker (a byte-different sw.js) and hold
//      pushes; the update prompt says a sync runs, "Reload when synced" waits for the push, then the
//      page reloads on the new version and nothing waits any more.
// Every step a person does happens in the page. The site admin who reads the captured mail is the
// demo admin of the seed.
import assert from 'node:assert/strict';
import { randomBytes } from 'node:crypto';
import http from 'node:http';
import { launchFreshContext } from './browser.mjs';

const PASSWORD = 'quartz-lantern-8128';
const run = randomBytes(3).toString('hex');
const address = (who) => `${who}.${run}@example.org`;

/** Accounts made by earlier tests of this run (registrations are rate-limited per address). */
const accounts = {};
/** The project of the first test (owner: 'owner'; 'invitee' is a member), reused by later ones. */
const shared = { projectId: null, projectName: null, mapUrl: null };

/** @param {import('playwright-core').Page} page */
async function register(page, baseUrl, who, displayName) {
  await page.goto(`${baseUrl}/register`);
  await page.locator('[data-path="email"]').fill(address(who));
  await page.locator('[data-path="displayName"]').fill(displayName);
  await page.locator('[data-path="password"]').fill(PASSWORD);
  await page.getByRole('button', { name: 'Create the account' }).click();
  await page.getByTestId('signed-in-user').filter({ hasText: displayName }).waitFor();
  accounts[who] = { email: address(who), displayName };
}

/** @param {import('playwright-core').Page} page */
async function signIn(page, baseUrl, who) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.locator('[data-path="email"]').fill(accounts[who].email);
  await page.locator('[data-path="password"]').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-user').filter({ hasText: accounts[who].displayName }).waitFor();
}

/** The demo site admin (db/seeders/0001-demo-accounts.mjs). */
const DEMO_ADMIN = { email: 'ada.quill@example.org', password: 'admin-lantern-4821', displayName: 'Ada Quill' };

/** The admin's context: the demo site admin signed in, on the Mail page (link in the header). */
async function openAdminMail(baseUrl, screenshot, shotName) {
  const admin = await launchFreshContext();
  const page = admin.context.pages()[0] ?? (await admin.context.newPage());
  await page.goto(`${baseUrl}/sign-in`);
  await page.locator('[data-path="email"]').fill(DEMO_ADMIN.email);
  await page.locator('[data-path="password"]').fill(DEMO_ADMIN.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-user').filter({ hasText: DEMO_ADMIN.displayName }).waitFor();
  await page.getByRole('link', { name: 'Mail' }).click({ timeout: 15_000 });
  await page.getByRole('heading', { name: 'Captured mail' }).waitFor();
  return { admin, page, shot: () => screenshot(shotName, page) };
}

/**
 * Owner invites `who` as `role` on the members page; the admin reads the link; `who` opens it in
 * a fresh context and registers. Returns the invitee's browser (signed in, on the project page).
 */
async function inviteAndJoin({ baseUrl, page, screenshot, projectId, who, displayName, role, shots }) {
  await page.goto(`${baseUrl}/projects/${projectId}/members`);
  await page.locator('[data-path="email"]').fill(address(who));
  await page.locator('[data-path="role"]').selectOption(role);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await page.getByRole('status').filter({ hasText: `Invitation sent to ${address(who)}` }).waitFor();
  await page.locator(`[data-invitation="${address(who)}"] [data-state="pending"]`).waitFor();
  if (shots) await screenshot(`${shots}-owner-invited`);

  const { admin, page: adminPage, shot } = await openAdminMail(baseUrl, screenshot, `${shots ?? 'group'}-admin-mail`);
  let href;
  try {
    await adminPage.getByRole('textbox', { name: 'Recipient filter' }).fill(address(who));
    const message = adminPage.locator(`[data-mail-to="${address(who)}"]`).filter({ hasText: 'invites you' }).first();
    await message.waitFor();
    href = await message.locator('[data-mail-link]').first().getAttribute('href');
    if (shots) await shot();
  } finally {
    await admin.close();
  }
  assert.match(href ?? '', /^\/invitations\/accept#token=/, 'the captured invitation links into the app');

  const invitee = await launchFreshContext();
  const ipage = invitee.context.pages()[0] ?? (await invitee.context.newPage());
  await ipage.goto(`${baseUrl}${href}`);
  await ipage.getByRole('heading', { name: /^Join/ }).waitFor();
  await ipage.getByText(`as ${role}`, { exact: false }).first().waitFor();
  if (shots) await screenshot(`${shots}-invitee-link`, ipage);
  await ipage.locator('[data-path="displayName"]').fill(displayName);
  await ipage.locator('[data-path="password"]').fill(PASSWORD);
  await ipage.getByRole('button', { name: 'Create the account and join' }).click();
  await ipage.waitForURL(new RegExp(`/projects/${projectId}$`));
  accounts[who] = { email: address(who), displayName };
  return { invitee, ipage };
}

/** @param {import('playwright-core').Page} page */
async function createProject(page, baseUrl, name) {
  await page.goto(`${baseUrl}/projects`);
  await page.locator('[data-path="name"]').fill(name);
  await page.getByRole('button', { name: 'Create project' }).click();
  await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
  await page.getByRole('heading', { level: 1, name }).waitFor();
  return page.url().split('/').pop();
}

/** Waits until the header's sync badge shows `phase`. */
async function syncPhase(page, phase, timeout = 20_000) {
  await page.locator(`[data-testid="sync-badge"][data-phase="${phase}"]`).waitFor({ timeout });
}

/**
 * A pass-through proxy to the server under test with two switches a test can flip: `deploy()`
 * serves sw.js with a comment appended (to the browser a new service-worker version, as after a
 * deployment; conditional headers are dropped so the check cannot answer 304), and `holdPushes()`
 * keeps sync pushes waiting until the returned function is called.
 */
async function startSwitchProxy(baseUrl) {
  const target = new URL(baseUrl);
  let deployedAt = null;
  let hold = null;
  const server = http.createServer(async (req, res) => {
    if (hold && req.url.includes('/sync/push')) await hold;
    const isSw = deployedAt !== null && req.url.split('?')[0] === '/sw.js';
    const headers = { ...req.headers, host: target.host };
    if (isSw) {
      delete headers['if-none-match'];
      delete headers['if-modified-since'];
    }
    const upstream = http.request({ host: target.hostname, port: target.port, path: req.url, method: req.method, headers }, (r) => {
      if (!isSw) {
        res.writeHead(r.statusCode ?? 502, r.headers);
        r.pipe(res);
        return;
      }
      const chunks = [];
      r.on('data', (c) => chunks.push(c));
      r.on('end', () => {
        const body = Buffer.concat([...chunks, Buffer.from(`\n// deployed ${deployedAt}\n`)]);
        const out = { ...r.headers, 'content-length': String(body.length) };
        delete out.etag;
        delete out['last-modified'];
        res.writeHead(r.statusCode ?? 502, out);
        res.end(body);
      });
    });
    upstream.on('error', (e) => {
      res.writeHead(502);
      res.end(String(e));
    });
    req.pipe(upstream);
  });
  await new Promise((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${server.address().port}`,
    deploy: () => {
      deployedAt = Date.now();
    },
    holdPushes: () => {
      let release;
      hold = new Promise((resolve) => {
        release = resolve;
      });
      return () => {
        hold = null;
        release();
      };
    },
    close: () => new Promise((resolve) => server.close(resolve)),
  };
}

export const tests = [
  {
    name: 'owner invites a collaborator by e-mail; the invitee follows the captured link, registers and sees the project',
    async run({ baseUrl, page, screenshot }) {
      const t0 = Date.now();
      await register(page, baseUrl, 'owner', `Olive Owner ${run}`);
      await syncPhase(page, 'up-to-date');
      const projectName = `Kagome survey ${run}`;
      const projectId = await createProject(page, baseUrl, projectName);
      await screenshot('group-1-project-home');
      Object.assign(shared, { projectId, projectName });

      const { invitee, ipage } = await inviteAndJoin({ baseUrl, page, screenshot, projectId, who: 'invitee', displayName: `Ivo Invitee ${run}`, role: 'editor', shots: 'group-2' });
      try {
        await ipage.getByRole('heading', { level: 1, name: projectName }).waitFor();
        await ipage.getByText('Shared project · you are editor').waitFor();
        await ipage.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Projects' }).click();
        await ipage.locator(`[data-project="${projectId}"]`).getByText('you are editor').waitFor();
        await screenshot('group-3-invitee-projects', ipage);
      } finally {
        await invitee.close();
      }

      // The owner sees the new member, and the accepted invitation; changes the role.
      await page.goto(`${baseUrl}/projects/${projectId}/members`);
      const row = page.locator(`[data-member="${address('invitee')}"]`);
      await row.waitFor();
      assert.equal(await row.getByRole('combobox').inputValue(), 'editor');
      await page.locator(`[data-invitation="${address('invitee')}"] [data-state="accepted"]`).waitFor();
      await row.getByRole('combobox').selectOption('reviewer');
      await page.waitForResponse((r) => r.url().includes('/members/') && r.request().method() === 'PATCH' && r.ok());
      await page.reload();
      await page.locator(`[data-member="${address('invitee')}"]`).waitFor();
      assert.equal(await page.locator(`[data-member="${address('invitee')}"]`).getByRole('combobox').inputValue(), 'reviewer');
      // The last owner cannot demote themselves: the server says why, the page shows it.
      await page.locator(`[data-member="${address('owner')}"]`).getByRole('combobox').selectOption('viewer');
      await page.getByRole('alert').filter({ hasText: /owner/i }).waitFor();
      await screenshot('group-4-members');
      console.log(`     invitation round trip through the page: ${((Date.now() - t0) / 1000).toFixed(1)} s`);
    },
  },
  {
    name: 'offline journey: sweep offline in a shared project, reload offline, back online the map syncs; another member pulls the same points',
    async run({ baseUrl, context, page, screenshot }) {
      // Setup (done by the first test when it ran): an owner and a second member of one project.
      if (accounts.owner) await signIn(page, baseUrl, 'owner');
      else await register(page, baseUrl, 'owner', `Olive Owner ${run}`);
      if (!shared.projectId) {
        shared.projectName = `Kagome survey ${run}`;
        shared.projectId = await createProject(page, baseUrl, shared.projectName);
        const { invitee } = await inviteAndJoin({ baseUrl, page, screenshot, projectId: shared.projectId, who: 'invitee', displayName: `Ivo Invitee ${run}`, role: 'viewer' });
        await invitee.close();
      }
      const { projectId, projectName } = shared;

      // The service worker must control the page before the network goes.
      await page.goto(`${baseUrl}/projects/${projectId}`);
      // No token refresh may be in flight at the reload below: a refresh answered to a page that is
      // gone leaves this device with a used refresh token, and the next refresh signs it out.
      await syncPhase(page, 'up-to-date');
      await page.evaluate(async () => {
        const registration = await navigator.serviceWorker.ready;
        const worker = registration.active;
        if (worker && worker.state !== 'activated') await new Promise((resolve) => worker.addEventListener('statechange', () => worker.state === 'activated' && resolve(undefined)));
      });
      await page.reload();
      await page.getByRole('heading', { level: 1, name: projectName }).waitFor();
      assert.equal(await page.evaluate(() => navigator.serviceWorker.controller?.state ?? null), 'activated');
      await syncPhase(page, 'up-to-date');

      // Offline: a model and an ED cut in the shared project.
      await context.setOffline(true);
      await syncPhase(page, 'offline');
      await page.getByRole('link', { name: 'New model' }).last().click();
      await page.getByTestId('model-project').filter({ hasText: projectName }).waitFor();
      await page.getByText('The model is valid.').waitFor();
      await page.locator('[data-path="$.name"]').fill(`offline chain ${run}`);
      await page.getByRole('button', { name: 'Save model' }).click();
      await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
      await page.getByRole('button', { name: 'Sweep this model →' }).click();
      await page.getByRole('form', { name: 'Sweep' }).waitFor();
      await page.locator('[data-path="$.name"]').fill(`offline cut ${run}`);
      await page.selectOption('[data-path="$.axes[0].parameter"]', 'V');
      await page.locator('[data-path="$.axes[0].from"]').fill('0');
      await page.locator('[data-path="$.axes[0].to"]').fill('3');
      await page.locator('[data-path="$.axes[0].points"]').fill('7');
      await page.getByText('7 coarse points').waitFor();
      await page.getByRole('button', { name: 'Create sweep and start' }).click();
      await page.waitForURL(/\/sweeps\//);
      await page.locator('[data-run-state="done"]').waitFor({ timeout: 20_000 });
      const waiting = Number(await page.getByTestId('sync-badge').getAttribute('data-waiting'));
      assert.ok(waiting >= 3, `model, sweep and map wait in the outbox (badge says ${waiting})`);
      await screenshot('group-5-offline-sweep');
      await page.getByRole('link', { name: 'Open the map' }).click();
      await page.waitForURL(/\/maps\//);
      const mapUrl = page.url();
      shared.mapUrl = mapUrl;

      // Reload while still offline: the app (service worker) and the map (IndexedDB) are there.
      await page.reload();
      await page.getByTestId('map-view').waitFor();
      assert.equal(await page.locator('[data-testid="cut-plot"] circle[data-point]').count(), 7);
      const networkDown = await page.evaluate(() => fetch(`/api/health?probe=${Date.now()}`).then(() => false, () => true));
      assert.ok(networkDown, 'the network is really off after the reload');
      await page.getByTestId('signed-in-user').filter({ hasText: accounts.owner.displayName }).waitFor();
      await screenshot('group-6-offline-reload');

      // The sync page says why each change waits: the network.
      await page.getByTestId('sync-badge').click();
      await page.waitForURL(/\/sync$/);
      const reasons = page.getByRole('list', { name: 'Waiting' }).getByTestId('outbox-reason');
      await reasons.first().waitFor();
      assert.ok((await reasons.count()) >= 3, 'model, sweep and map are listed');
      // Chromium's offline emulation may leave navigator.onLine true after a reload; then the page
      // learns it from the failed round instead.
      for (const text of await reasons.allTextContents()) assert.match(text, /^waiting — (for the network|the last attempt failed \(The server did not answer)/);
      await screenshot('group-6b-sync-page-offline');
      await page.goBack();
      await page.getByTestId('map-view').waitFor();

      // Back online: the outbox drains.
      const t0 = Date.now();
      await context.setOffline(false);
      await syncPhase(page, 'up-to-date', 40_000);
      const syncMs = Date.now() - t0;
      const identity = await page.getByTestId('map-identity').getAttribute('title');
      const digest = await page.getByTestId('map-digest').getAttribute('title');
      const points = await page.getByTestId('map-digest').getAttribute('data-points');
      await page.getByTestId('sync-badge').click();
      await page.getByRole('heading', { name: 'Waiting to be pushed (0)' }).waitFor();
      await screenshot('group-7-synced');

      // Another member pulls and sees the same map.
      const other = await launchFreshContext();
      try {
        const opage = other.context.pages()[0] ?? (await other.context.newPage());
        await signIn(opage, baseUrl, 'invitee');
        const t1 = Date.now();
        await opage.goto(`${baseUrl}/projects/${projectId}`);
        await opage.getByRole('list', { name: 'Items' }).getByRole('link', { name: `offline cut ${run}` }).last().waitFor({ timeout: 20_000 });
        const pullMs = Date.now() - t1;
        await opage.goto(mapUrl);
        await opage.getByTestId('map-view').waitFor();
        assert.equal(await opage.getByTestId('map-identity').getAttribute('title'), identity, 'same map identity');
        assert.equal(await opage.getByTestId('map-digest').getAttribute('data-points'), points, 'same number of points');
        assert.equal(await opage.getByTestId('map-digest').getAttribute('title'), digest, 'same points digest');
        await screenshot('group-8-other-member', opage);
        console.log(`     offline journey: ${points} points, outbox drained ${(syncMs / 1000).toFixed(1)} s after going online, other member saw the map ${(pullMs / 1000).toFixed(1)} s after opening the project; digest ${digest?.slice(0, 12)}…`);
      } finally {
        await other.close();
      }
    },
  },
  {
    name: 'compare: an ED cut and a mean-field cut of one model side by side, difference map, boundary overlay',
    async run({ baseUrl, page, screenshot }) {
      // Signed out: the local space is enough.
      await page.goto(`${baseUrl}/models/new`);
      await page.getByText('The model is valid.').waitFor();
      await page.locator('[data-path="$.name"]').fill(`compare chain ${run}`);
      await page.getByRole('button', { name: 'Save model' }).click();
      await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
      const modelUrl = page.url();
      const mapIds = [];
      for (const method of ['ed', 'meanfield']) {
        await page.goto(modelUrl);
        await page.getByRole('button', { name: 'Sweep this model →' }).click();
        await page.getByRole('form', { name: 'Sweep' }).waitFor();
        await page.locator('[data-path="$.name"]').fill(`${method} cut ${run}`);
        await page.selectOption('[data-path="$.method"]', method);
        await page.selectOption('[data-path="$.axes[0].parameter"]', 'V');
        await page.locator('[data-path="$.axes[0].from"]').fill('0');
        await page.locator('[data-path="$.axes[0].to"]').fill('4');
        await page.locator('[data-path="$.axes[0].points"]').fill('9');
        await page.getByRole('button', { name: 'Create sweep and start' }).click();
        await page.waitForURL(/\/sweeps\//);
        await page.locator('[data-run-state="done"]').waitFor({ timeout: 25_000 });
        await page.getByRole('link', { name: 'Open the map' }).click();
        await page.waitForURL(/\/maps\//);
        mapIds.push(page.url().split('/').pop());
      }
      await page.getByRole('link', { name: 'Compare with…' }).click();
      await page.getByRole('combobox', { name: 'Map B' }).selectOption(mapIds[0]);
      const comparison = page.getByTestId('comparison');
      await comparison.waitFor();
      assert.equal(await comparison.getAttribute('data-common'), '9', 'both cuts share their 9 points');
      await page.getByText('Read the differences with care').waitFor();
      await page.getByRole('combobox', { name: 'Observable' }).selectOption('energy');
      const cells = await page.getByRole('region', { name: 'Difference map' }).locator('[data-point]').count();
      assert.equal(cells, 9);
      const worst = await page.locator('[data-observable="energyPerSite"] td').nth(2).textContent();
      console.log(`     compare: max |E/N (ED, 8 sites) − E/N (mean-field)| = ${worst}; ${await page.getByTestId('comparison-summary').textContent()}`);
      await screenshot('group-9-compare');
    },
  },
  {
    name: 'conflict journey: two members rename the same phase label, one offline; the second push shows a conflict; resolving it leaves one agreed name on both',
    async run({ baseUrl, page, screenshot }) {
      if (!shared.mapUrl || !accounts.invitee) {
        console.log('     skipped: needs the offline journey of this run (its shared map and second member)');
        return;
      }
      const rename = async (p, from, to) => {
        const entry = p.locator('[data-label="superfluid"]').filter({ has: p.getByTestId('legend-name') });
        await entry.getByRole('button', { name: /^Rename/ }).click();
        await p.getByRole('textbox', { name: /^New name for/ }).fill(to);
        await p.getByRole('button', { name: 'Save', exact: true }).click();
        await p.getByTestId('legend-name').filter({ hasText: to }).waitFor();
      };
      // The owner makes the second member an editor (members page).
      await signIn(page, baseUrl, 'owner');
      await page.goto(`${baseUrl}/projects/${shared.projectId}/members`);
      await page.locator(`[data-member="${address('invitee')}"]`).getByRole('combobox').selectOption('editor');
      await page.waitForResponse((r) => r.url().includes('/members/') && r.request().method() === 'PATCH' && r.ok());

      const other = await launchFreshContext();
      try {
        const opage = other.context.pages()[0] ?? (await other.context.newPage());
        await signIn(opage, baseUrl, 'invitee');
        await syncPhase(opage, 'up-to-date');
        await opage.goto(shared.mapUrl);
        await opage.getByTestId('map-view').waitFor();
        // The member renames while offline …
        await other.context.setOffline(true);
        await rename(opage, 'superfluid', 'liquid (member)');
        await syncPhase(opage, 'offline');
        // … the owner renames the same label online (pushed at once).
        await page.goto(shared.mapUrl);
        await page.getByTestId('map-view').waitFor();
        await rename(page, 'superfluid', 'liquid (owner)');
        await syncPhase(page, 'up-to-date');
        // The member comes back: the push is refused as stale and shows a conflict.
        await other.context.setOffline(false);
        await syncPhase(opage, 'conflict', 30_000);
        await opage.getByTestId('sync-badge').click();
        const card = opage.locator('[data-conflict]');
        await card.waitFor();
        assert.equal(await card.locator('[data-side="mine"][data-field="name"]').textContent(), 'liquid (member)');
        assert.equal(await card.locator('[data-side="theirs"][data-field="name"]').textContent(), 'liquid (owner)');
        await screenshot('group-10-conflict', opage);
        await card.getByRole('button', { name: 'Edit a combined name' }).click();
        await opage.getByRole('textbox', { name: 'Agreed name' }).fill('superfluid liquid (agreed)');
        await opage.getByRole('button', { name: 'Save and push' }).click();
        await syncPhase(opage, 'up-to-date', 20_000);
        await opage.goto(shared.mapUrl);
        await opage.getByTestId('legend-name').filter({ hasText: 'superfluid liquid (agreed)' }).waitFor();
        // The owner pulls (Sync now on the sync page) and sees the agreed name too.
        await page.getByTestId('sync-badge').click();
        await page.getByRole('button', { name: 'Sync now' }).click();
        await syncPhase(page, 'up-to-date');
        await page.goto(shared.mapUrl);
        await page.getByTestId('legend-name').filter({ hasText: 'superfluid liquid (agreed)' }).waitFor();
        await screenshot('group-11-agreed');
      } finally {
        await other.close();
      }
    },
  },
  {
    name: 'a new version while a change is being pushed: the update prompt waits for the sync, then reloads on the new version; nothing is lost',
    async run({ page, baseUrl, screenshot }) {
      const proxy = await startSwitchProxy(baseUrl);
      try {
        const base = proxy.url;
        await page.goto(`${base}/sign-in`);
        await page.locator('[data-path="email"]').fill('otto.vane@example.org');
        await page.locator('[data-path="password"]').fill('editor-pebble-4821');
        await page.getByRole('button', { name: 'Sign in' }).click();
        await page.getByTestId('signed-in-user').filter({ hasText: 'Otto Vane' }).waitFor();
        // The service worker installs; after one reload it controls the page (as on a second visit).
        await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
        await page.reload();
        await page.waitForFunction(() => navigator.serviceWorker.controller !== null, null, { timeout: 20_000 });
        await page.locator('[data-testid="sync-badge"][data-phase="up-to-date"]').waitFor({ timeout: 30_000 });

        // A change: a new model in the demo project; its push is held by the proxy (a slow network).
        const release = proxy.holdPushes();
        await page.goto(`${base}/projects`);
        await page.getByRole('link', { name: 'Demo: kagome strip survey' }).first().click();
        await page.getByRole('heading', { level: 1, name: 'Demo: kagome strip survey' }).waitFor();
        await page.getByRole('link', { name: 'New model' }).last().click();
        await page.getByTestId('model-project').filter({ hasText: 'Demo: kagome strip survey' }).waitFor();
        await page.getByText('The model is valid.').waitFor();
        await page.locator('[data-path="$.name"]').fill(`update-check model ${run}`);
        await page.getByRole('button', { name: 'Save model' }).click();
        await page.waitForURL(/\/models\/[0-9a-f-]{36}$/);
        await page.locator('[data-testid="sync-badge"][data-phase="syncing"]').waitFor({ timeout: 15_000 });

        // A new version is deployed; the browser's update check finds it.
        proxy.deploy();
        await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
        const prompt = page.getByTestId('update-prompt');
        await page.locator('[data-testid="update-prompt"][data-kind="busy"]').waitFor({ timeout: 20_000 });
        assert.match(await prompt.innerText(), /A sync is running \(1 change to push\)/);
        assert.match(await prompt.innerText(), /Nothing is lost by reloading/);
        await screenshot('group-12-update-busy');

        await page.evaluate(() => {
          window.__beforeUpdate = true;
        });
        await prompt.getByRole('button', { name: 'Reload when synced' }).click();
        await page.locator('[data-testid="update-prompt"][data-kind="pending"]').waitFor();
        await screenshot('group-13-update-pending');
        // Still the old page while the push is held: the reload waits for the sync.
        await page.waitForTimeout(1000);
        assert.equal(await page.evaluate(() => window.__beforeUpdate === true), true, 'no reload while the push is held');

        const reloaded = page.waitForEvent('load', { timeout: 20_000 });
        release();
        await reloaded;
        await page.getByTestId('signed-in-user').waitFor();
        assert.equal(await page.evaluate(() => window.__beforeUpdate), undefined, 'the page was reloaded');
        await page.locator('[data-testid="sync-badge"][data-phase="up-to-date"][data-waiting="0"]').waitFor({ timeout: 20_000 });
        assert.equal(await prompt.count(), 0, 'the new version is active: no prompt after the reload');
        await page.getByRole('heading', { level: 1, name: `update-check model ${run}` }).waitFor();
        await screenshot('group-14-updated');
      } finally {
        await proxy.close();
      }
    },
  },
];
