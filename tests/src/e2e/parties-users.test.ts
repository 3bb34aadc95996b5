import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  baseUrlOrThrow,
  DEMO_SIGN_INS,
  DESKTOP,
  inFreshPage,
  launchBrowser,
  PHONE,
  screenshot,
  signInAndWait,
} from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('parties', () => {
  it('lets the owner add a customer, who then appears in the list', async () => {
    await inFreshPage(browser, DESKTOP, 'add-party', async ({ page }) => {
      const name = `Harrow Creek Grazing ${Date.now()}`;
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/parties`);
      await page.getByRole('button', { name: 'Add party' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByText('Customer', { exact: true }).click();
      expect(await dialog.getByRole('textbox', { name: 'Relationship' }).inputValue()).toBe('Neighbour');
      await dialog.getByLabel('Name', { exact: true }).fill(name);
      await dialog.getByLabel('E-mail', { exact: true }).fill('not-an-address');
      await dialog.getByRole('button', { name: 'Add party' }).click();
      await dialog.getByText('Enter a valid e-mail address.').waitFor();
      await screenshot(page, 'add-party-invalid-desktop');

      await dialog.getByLabel('E-mail', { exact: true }).fill('office@harrow-creek.example');
      await dialog.getByRole('button', { name: 'Add party' }).click();
      await dialog.waitFor({ state: 'hidden' });
      await page.getByLabel('Search by name').fill(name);
      await page.getByRole('cell', { name, exact: true }).waitFor();
      // The search is kept in the address, so the filtered list can be bookmarked.
      await expect.poll(() => new URL(page.url()).searchParams.get('q')).toBe(name);
      // Header row plus the one match, once the searched page has replaced the previous one.
      await expect.poll(() => page.getByRole('row').count()).toBe(2);
      await screenshot(page, 'party-added-owner-desktop');
    });
  });

  it('shows the bookkeeper the parties without add or edit controls', async () => {
    await inFreshPage(browser, PHONE, 'parties-bookkeeper', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/parties`);
      await page.getByRole('cell', { name: 'Fenwold Township Road District', exact: true }).waitFor();
      expect(await page.getByRole('button', { name: 'Add party' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: /^Edit / }).count()).toBe(0);
      await screenshot(page, 'parties-bookkeeper-phone');
    });
  });
});

describe('users', () => {
  it('asks the owner to tie a customer sign-in to a customer before inviting', async () => {
    await inFreshPage(browser, DESKTOP, 'invite-customer', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/users`);
      await page.getByRole('cell', { name: /partner@hitchbook\.test/ }).waitFor();
      // The owner cannot change or remove their own sign-in, so cannot lock themself out.
      expect(await page.getByRole('button', { name: /^Change role of / }).count()).toBe(5);
      expect(await page.getByRole('button', { name: 'Change role of Ilse Quillback' }).count()).toBe(0);
      await screenshot(page, 'users-owner-desktop');
      await page.getByRole('button', { name: 'Invite someone' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Name', { exact: true }).fill('Wren Ashdown');
      await dialog.getByLabel('E-mail', { exact: true }).fill(`wren-${Date.now()}@ashdown.example`);
      await dialog.getByRole('textbox', { name: 'Role' }).click();
      await page.getByRole('option', { name: 'Customer' }).click();
      await dialog.getByRole('button', { name: 'Send invitation' }).click();
      await dialog.getByText('A customer sign-in must be tied to a customer party.').waitFor();
      await screenshot(page, 'invite-customer-needs-party-desktop');
    });
  });

  it('lets the owner invite an operator, see the invitation waiting, and withdraw it', async () => {
    await inFreshPage(browser, DESKTOP, 'invite-and-remove', async ({ page }) => {
      const email = `hand-${Date.now()}@example.test`;
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/users`);
      await page.getByRole('button', { name: 'Invite someone' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Name', { exact: true }).fill('Sorrel Tamsin');
      await dialog.getByLabel('E-mail', { exact: true }).fill(email);
      await dialog.getByRole('button', { name: 'Send invitation' }).click();
      await dialog.waitFor({ state: 'hidden' });

      const row = page.getByRole('row', { name: new RegExp(email.replace(/[.]/g, '\\.')) });
      await row.waitFor();
      expect(await row.textContent()).toContain('Invited');
      await screenshot(page, 'user-invited-owner-desktop');

      await row.getByRole('button', { name: 'Remove Sorrel Tamsin' }).click();
      await page.getByRole('dialog').getByRole('button', { name: 'Remove' }).click();
      await row.waitFor({ state: 'detached' });
    });
  });

  it('shows the bookkeeper the users without invite or change controls', async () => {
    await inFreshPage(browser, DESKTOP, 'users-bookkeeper', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/users`);
      await page.getByRole('cell', { name: /owner@hitchbook\.test/ }).waitFor();
      expect(await page.getByRole('button', { name: 'Invite someone' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: /^Change role of / }).count()).toBe(0);
    });
  });
});

describe('account', () => {
  it('checks that the new password was typed the same twice before sending it', async () => {
    await inFreshPage(browser, PHONE, 'account', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await page.getByTestId('user-menu').click();
      await page.getByRole('menuitem', { name: 'Account' }).click();
      await page.getByRole('heading', { name: 'Change password' }).waitFor();
      await page.getByLabel('Current password', { exact: true }).fill('hitchbook-demo');
      await page.getByLabel('New password', { exact: true }).fill('a longer new phrase');
      await page.getByLabel('New password, again', { exact: true }).fill('a longer new phrasE');
      await page.getByRole('button', { name: 'Change password' }).click();
      await page.getByText('The two passwords are not the same.').waitFor();
      await screenshot(page, 'account-operator-phone');
    });
  });
});
