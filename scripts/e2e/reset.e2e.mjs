// Password reset in the browser, against the real server and MariaDB, with a seeded demo account
// (db/seeders/0001-demo-accounts.mjs): "Forgot password?" on the sign-in page → the reset e-mail,
// read by the demo site admin on the admin Mail page (the server's fake SMTP store) → its link
// (/reset-password#token=…) opened in the user's browser → a weak password and a mistyped
// confirmation are refused beside their fields → a good one is set → signing in with it works →
// the same link a second time says it cannot be used. The demo password is then set back the same
// way, so that the printed demo sign-ins keep working.
// Every step a person does happens in the page.
import assert from 'node:assert/strict';
import { randomBytes } from 'node:crypto';
import { launchFreshContext } from './browser.mjs';

const USER = { email: 'pim.arbor@example.org', password: 'viewer-sparrow-4821', displayName: 'Pim Arbor' };
const ADMIN = { email: 'ada.quill@example.org', password: 'admin-lantern-4821', displayName: 'Ada Quill' };

/** @param {import('playwright-core').Page} page */
async function signIn(page, baseUrl, who, password = who.password) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.locator('[data-path="email"]').fill(who.email);
  await page.locator('[data-path="password"]').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-user').filter({ hasText: who.displayName }).waitFor();
}

/** The admin's Mail page, filtered to the user's address; returns the reset links shown, newest first. */
async function resetLinks(apage) {
  await apage.getByRole('textbox', { name: 'Recipient filter' }).fill(USER.email);
  await apage.locator(`[data-mail-to="${USER.email}"]`).first().or(apage.getByText('No messages.')).waitFor();
  const messages = apage.locator(`[data-mail-to="${USER.email}"]`).filter({ hasText: 'Reset your Phasewright password' });
  const out = [];
  for (const m of await messages.all()) out.push(await m.locator('[data-mail-link]').first().getAttribute('href'));
  return out;
}

/**
 * "Forgot password?" from the sign-in page; the admin reloads the Mail page until a new reset
 * link arrives; returns it.
 * @param {import('playwright-core').Page} page  @param {import('playwright-core').Page} apage
 */
async function requestReset(page, apage, baseUrl, screenshot, shot) {
  await apage.reload();
  const before = new Set(await resetLinks(apage));
  await page.goto(`${baseUrl}/sign-in`);
  await page.locator('[data-path="email"]').fill(USER.email);
  await page.getByRole('link', { name: 'Forgot password?' }).click();
  await page.waitForURL(/\/reset-password\?email=/);
  assert.equal(await page.locator('[data-path="email"]').inputValue(), USER.email, 'the address carries over from the sign-in form');
  await page.getByTestId('reset-request-submit').click();
  await page.getByTestId('reset-requested').waitFor();
  if (shot) await screenshot(`${shot}-requested`);
  for (let i = 0; i < 40; i++) {
    await apage.reload();
    const fresh = (await resetLinks(apage)).filter((l) => l && !before.has(l));
    if (fresh.length > 0) {
      if (shot) await screenshot(`${shot}-admin-mail`, apage);
      return fresh[0];
    }
    await apage.waitForTimeout(250);
  }
  throw new Error('no new reset e-mail reached the fake SMTP store');
}

/** Opens the e-mailed link and sets `password`; lands on the sign-in page. */
async function setPassword(page, baseUrl, link, password) {
  await page.goto(new URL(link, baseUrl).href);
  await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
  await page.locator('[data-path="password"]').fill(password);
  await page.locator('[data-path="confirm"]').fill(password);
  await page.getByTestId('reset-submit').click();
  await page.getByTestId('reset-done').waitFor();
}

export const tests = [
  {
    name: 'password reset: request from the sign-in page, the e-mailed link, weak and mismatched passwords refused, new password signs in, the link works once',
    async run({ baseUrl, page, screenshot }) {
      const newPassword = `fresh-heron-${randomBytes(3).toString('hex')}`;
      const adminBrowser = await launchFreshContext();
      try {
        const apage = adminBrowser.context.pages()[0] ?? (await adminBrowser.context.newPage());
        await signIn(apage, baseUrl, ADMIN);
        await apage.getByRole('link', { name: 'Mail' }).click();
        await apage.getByRole('heading', { name: 'Captured mail' }).waitFor();

        const link = await requestReset(page, apage, baseUrl, screenshot, 'reset-1');
        assert.match(link, /^\/reset-password#token=[A-Za-z0-9_-]{20,}$/, `the link is the app's reset page with the token in the fragment: ${link}`);

        // The link: a weak password and a mistyped confirmation are refused beside their fields.
        await page.goto(new URL(link, baseUrl).href);
        await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
        await page.locator('[data-path="password"]').fill('aaaaabbbbb');
        await page.locator('[data-path="confirm"]').fill('aaaaabbbbb');
        await page.getByTestId('reset-submit').click();
        const weak = page.locator('[data-field-error]').filter({ hasText: 'at least 5 different characters' });
        await weak.waitFor();
        await screenshot('reset-2-weak-password');
        await page.locator('[data-path="password"]').fill(newPassword);
        await page.locator('[data-path="confirm"]').fill(`${newPassword}x`);
        await page.getByTestId('reset-submit').click();
        await page.locator('[data-field-error]').filter({ hasText: 'The two passwords differ.' }).waitFor();
        await page.locator('[data-path="confirm"]').fill(newPassword);
        await page.getByTestId('reset-submit').click();
        await page.getByTestId('reset-done').waitFor();
        await screenshot('reset-3-done');

        // The old password no longer works; the new one does.
        await page.locator('[data-path="email"]').fill(USER.email);
        await page.locator('[data-path="password"]').fill(USER.password);
        await page.getByRole('button', { name: 'Sign in' }).click();
        await page.getByRole('alert').filter({ hasText: 'Wrong e-mail address or password' }).waitFor();
        await signIn(page, baseUrl, USER, newPassword);
        await screenshot('reset-4-signed-in');

        // The same link again: used.
        await page.goto(new URL(link, baseUrl).href);
        await page.locator('[data-path="password"]').fill(`${newPassword}-2`);
        await page.locator('[data-path="confirm"]').fill(`${newPassword}-2`);
        await page.getByTestId('reset-submit').click();
        await page.getByTestId('reset-token-error').filter({ hasText: 'already used' }).waitFor();
        await screenshot('reset-5-link-used');

        // Set the demo password back the same way (a second e-mail and link).
        const again = await requestReset(page, apage, baseUrl, screenshot, null);
        await setPassword(page, baseUrl, again, USER.password);
        await signIn(page, baseUrl, USER);
      } finally {
        await adminBrowser.close();
      }
    },
  },
];
