import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  baseUrlOrThrow,
  DEMO_SIGN_INS,
  DESKTOP,
  inFreshPage,
  launchBrowser,
  PHONE,
  screenshot,
  signIn,
  signInAndWait,
} from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function refusalAfterSignIn(page: Page, email: string, password: string): Promise<string> {
  await signIn(page, email, password);
  const alert = page.getByTestId('form-error');
  await alert.waitFor();
  return (await alert.textContent())?.trim() ?? '';
}

describe('sign-in refusal', () => {
  it('answers a wrong password and an unknown e-mail with the same words', async () => {
    await inFreshPage(browser, DESKTOP, 'sign-in-refusal', async ({ page }) => {
      const wrongPassword = await refusalAfterSignIn(page, DEMO_SIGN_INS.owner, 'not-the-password');
      await screenshot(page, 'sign-in-refused-desktop');
      const unknownEmail = await refusalAfterSignIn(page, `nobody-${Date.now()}@hitchbook.test`, 'not-the-password');

      expect(wrongPassword).toBe('Wrong e-mail or password.');
      expect(unknownEmail).toBe(wrongPassword);
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      expect(await page.getByTestId('user-menu').count()).toBe(0);
    });
  });

  it('offers the password reset from the sign-in form on a phone and gives the same answer for any e-mail', async () => {
    await inFreshPage(browser, PHONE, 'password-reset', async ({ page }) => {
      await page.goto(`${baseUrlOrThrow()}/sign-in`);
      const forgot = page.getByRole('link', { name: 'Forgot your password?' });
      await forgot.waitFor();
      await screenshot(page, 'sign-in-phone');
      await forgot.click();
      await page.getByRole('heading', { name: 'Reset your password' }).waitFor();
      await page.getByLabel('E-mail').fill(DEMO_SIGN_INS.operator);
      await page.getByRole('button', { name: 'Send the reset link' }).click();
      const answer = page.getByTestId('reset-requested');
      await answer.waitFor();
      const forKnown = (await answer.textContent())?.trim();
      await screenshot(page, 'reset-requested-phone');

      await page.goto(`${baseUrlOrThrow()}/forgot-password`);
      await page.getByLabel('E-mail').fill(`nobody-${Date.now()}@hitchbook.test`);
      await page.getByRole('button', { name: 'Send the reset link' }).click();
      await answer.waitFor();
      expect((await answer.textContent())?.trim()).toBe(forKnown);
    });
  });

  it('explains an invitation link that is bad or used up instead of showing a form', async () => {
    await inFreshPage(browser, PHONE, 'bad-invitation', async ({ page }) => {
      await page.goto(`${baseUrlOrThrow()}/accept-invite?token=${'x'.repeat(32)}`);
      await page.getByRole('heading', { name: "This invitation can't be used" }).waitFor();
      expect(await page.getByLabel('Your name').count()).toBe(0);
      await screenshot(page, 'invitation-unusable-phone');
    });
  });

  it('refuses an expired reset link and offers a new one', async () => {
    await inFreshPage(browser, DESKTOP, 'bad-reset', async ({ page }) => {
      await page.goto(`${baseUrlOrThrow()}/reset-password?token=${'y'.repeat(32)}`);
      await page.getByLabel('New password', { exact: true }).fill('a fresh long phrase');
      await page.getByLabel('New password, again', { exact: true }).fill('a fresh long phrase');
      await page.getByRole('button', { name: 'Set the new password' }).click();
      await page.getByTestId('form-error').waitFor();
      await page.getByRole('link', { name: 'Send me a new reset link' }).waitFor();
      expect(await page.getByRole('heading', { name: 'Password changed' }).count()).toBe(0);
      await screenshot(page, 'reset-link-refused-desktop');
    });
  });

  it('keeps the session across a reload without storing the token in the page, and ends it on sign-out', async () => {
    await inFreshPage(browser, DESKTOP, 'session', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.reload();
      await page.getByTestId('user-menu').waitFor();
      const stored = await page.evaluate(() => JSON.stringify({ ...localStorage }) + JSON.stringify({ ...sessionStorage }));
      expect(stored).not.toMatch(/eyJ/);

      await page.getByTestId('user-menu').click();
      await page.getByRole('menuitem', { name: 'Sign out' }).click();
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      await page.goto(`${baseUrlOrThrow()}/parties`);
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
    });
  });
});
