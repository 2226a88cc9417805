// The status page reads GET /api/health from the server under test (which has a real DB).
import assert from 'node:assert/strict';

export const tests = [
  {
    name: 'the status page shows the database up, with server and core versions',
    async run({ baseUrl, page, screenshot }) {
      const health = page.waitForResponse((response) => response.url().endsWith('/api/health'));
      await page.goto(`${baseUrl}/status`);
      const response = await health;
      assert.equal(response.status(), 200, 'GET /api/health answers 200');
      const body = await response.json();
      assert.equal(body.database.status, 'up', `the server reports its database up (${JSON.stringify(body.database)})`);

      const database = page.locator('[data-health="database"]');
      await database.waitFor({ state: 'visible' });
      assert.equal(await database.getAttribute('data-state'), 'up');
      await database.getByText('Database is up').waitFor();
      const latency = await database.getByText(/ms$/).textContent();
      assert.match(latency ?? '', /^(< 1|\d+) ms$/, 'round-trip time shown in ms');

      const server = page.locator('[data-health="server"]');
      await server.getByText(body.server.version, { exact: true }).waitFor();
      const core = page.locator('[data-health="core"]');
      await core.getByText(body.core.version, { exact: true }).first().waitFor();
      await screenshot('status');
    },
  },
  {
    name: 'the status page says so clearly when the server cannot be reached',
    async run({ baseUrl, page, screenshot }) {
      await page.route('**/api/health', (route) => route.abort('connectionrefused'));
      await page.goto(`${baseUrl}/status`);
      const notice = page.locator('[data-health="connection"][data-state="unreachable"]');
      await notice.waitFor({ state: 'visible' });
      await notice.getByText('Sync server unreachable').waitFor();
      assert.equal(await page.locator('[data-health="database"]').count(), 0, 'no database card without a report');
      await screenshot('status-unreachable');
    },
  },
];
