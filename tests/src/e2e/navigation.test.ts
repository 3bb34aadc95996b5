import type { Browser, Locator } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  baseUrlOrThrow,
  DEMO_SIGN_INS,
  DESKTOP,
  inFreshPage,
  launchBrowser,
  navigationLabels,
  PHONE,
  screenshot,
  signInAndWait,
} from './browser.js';

const ESTIMATES = ['Estimates', 'Machine-hour rate', 'Own or hire', 'Joint ownership planner'];
const FIELD_WORK = ['Work', 'Machines', 'Fields'];
const SETTLING = ['Square-up', 'Year-end'];
const BILLING = ['Invoices', 'Rates'];

// What each role is meant to see (product brief, roles and their navigation; apps/web/src/lib/areas.ts).
const EXPECTED_NAVIGATION: Record<keyof typeof DEMO_SIGN_INS, string[]> = {
  owner: ['Dashboard', ...FIELD_WORK, ...SETTLING, ...BILLING, ...ESTIMATES, 'Parties', 'Users', 'Audit log', 'Account'],
  partner: ['Dashboard', ...FIELD_WORK, ...SETTLING, ...BILLING, ...ESTIMATES, 'Parties', 'Account'],
  operator: ['Dashboard', ...FIELD_WORK, 'Account'],
  bookkeeper: ['Dashboard', ...FIELD_WORK, ...SETTLING, ...BILLING, ...ESTIMATES, 'Parties', 'Users', 'Audit log', 'Account'],
  customer: ['Dashboard', 'My invoices', 'Account'],
  customer2: ['Dashboard', 'My invoices', 'Account'],
};

/**
 * On a phone the closed navigation slides off the left edge rather than disappearing, so
 * "open" means wholly on screen and "closed" wholly off it; anything between is the slide.
 */
async function navigationPlace(locator: Locator): Promise<'open' | 'closed' | 'moving'> {
  const box = await locator.boundingBox();
  if (box === null || box.x + box.width <= 0) return 'closed';
  return box.x >= 0 ? 'open' : 'moving';
}

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('navigation by role', () => {
  for (const [role, email] of Object.entries(DEMO_SIGN_INS) as [keyof typeof DEMO_SIGN_INS, string][]) {
    it(`shows the ${role} exactly the ${role}'s areas`, async () => {
      await inFreshPage(browser, DESKTOP, `navigation-${role}`, async ({ page, foreignRequests }) => {
        await signInAndWait(page, email);
        await page.locator('[data-testid^="stat-"]').first().waitFor();
        expect(await navigationLabels(page)).toEqual(EXPECTED_NAVIGATION[role]);
        await screenshot(page, `dashboard-${role}-desktop`);
        expect(foreignRequests).toEqual([]);
      });
    });
  }

  it('shows an operator who types the machine-rate address a not-allowed page', async () => {
    await inFreshPage(browser, DESKTOP, 'not-allowed', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await page.goto(`${baseUrlOrThrow()}/estimates/machine-rate`);
      await page.getByTestId('not-allowed').waitFor();
      expect(await page.getByRole('heading', { name: 'Not available for your role' }).isVisible()).toBe(true);
      expect(await page.getByText('Machine-hour rate').count()).toBe(0);
      expect(await navigationLabels(page)).toEqual(EXPECTED_NAVIGATION.operator);
      await screenshot(page, 'not-allowed-operator-desktop');
    });
  });

  it('sends a signed-out visitor to sign-in and back to the page they asked for', async () => {
    await inFreshPage(browser, DESKTOP, 'return-after-sign-in', async ({ page }) => {
      await page.goto(`${baseUrlOrThrow()}/parties?kind=customer`);
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await page.getByLabel('E-mail').fill(DEMO_SIGN_INS.owner);
      await page.getByLabel('Password', { exact: true }).fill('hitchbook-demo');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('heading', { name: 'Households & customers' }).waitFor();
      expect(new URL(page.url()).search).toBe('?kind=customer');
      await page.getByRole('cell', { name: 'Fenwold Township Road District', exact: true }).waitFor();
      // Only customers are listed: no household badge anywhere in the table.
      expect(await page.getByRole('cell', { name: 'Household', exact: true }).count()).toBe(0);
      await screenshot(page, 'parties-customers-owner-desktop');
    });
  });

  it('shows a page-not-found screen for an unknown address', async () => {
    await inFreshPage(browser, DESKTOP, 'not-found', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/no-such-place`);
      await page.getByTestId('not-found').waitFor();
      expect(await page.getByRole('heading', { name: 'Page not found' }).isVisible()).toBe(true);
      await screenshot(page, 'not-found-partner-desktop');

      // The Estimates area itself opens on its first page.
      await page.goto(`${baseUrlOrThrow()}/estimates`);
      await page.getByRole('heading', { name: 'Machine-hour rate' }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/estimates/machine-rate');
    });
  });
});

describe('phone-sized screen', () => {
  it('folds the navigation behind a burger that opens and closes it', async () => {
    await inFreshPage(browser, PHONE, 'phone-navigation', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      const burger = page.getByTestId('nav-burger');
      const partiesLink = page.getByRole('link', { name: 'Parties' });
      expect(await burger.isVisible()).toBe(true);
      expect(await navigationPlace(partiesLink)).toBe('closed');
      await page.locator('[data-testid^="stat-"]').first().waitFor();
      await screenshot(page, 'dashboard-owner-phone');

      await burger.click();
      await expect.poll(() => navigationPlace(partiesLink)).toBe('open');
      await screenshot(page, 'navigation-open-owner-phone');

      await partiesLink.click();
      await page.getByRole('heading', { name: 'Households & customers' }).waitFor();
      await expect.poll(() => navigationPlace(partiesLink)).toBe('closed');
      await page.getByRole('cell', { name: 'Fenwold Township Road District', exact: true }).waitFor();
      await screenshot(page, 'parties-owner-phone');
    });
  });
});
