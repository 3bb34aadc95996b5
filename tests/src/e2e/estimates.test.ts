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
  signInAndWait,
} from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function fill(page: Page, label: string, value: string) {
  await page.getByLabel(label, { exact: true }).fill(value);
}

describe('own or hire', () => {
  it('finds the Field & Solie break-even of 58.82 acres and plots both costs', async () => {
    await inFreshPage(browser, DESKTOP, 'own-or-hire', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/estimates/own-or-hire`);
      // Field & Solie, "Break-Even Use" (trade reference §9): fixed $1,000/yr, operating $4.00/acre,
      // custom rate $21/acre; break-even 1,000 / (21 − 4) = 58.8 acres.
      await fill(page, 'Annual fixed cost', '1000');
      await fill(page, 'Custom rate', '21');
      await fill(page, 'Your variable cost', '4');
      await page.getByRole('button', { name: 'Find the break-even' }).click();
      await page.getByTestId('break-even-result').waitFor();
      expect(await page.getByTestId('break-even-acres').textContent()).toBe('58.82 acres a year');
      expect(await page.locator('.recharts-line').count()).toBe(2);
      expect(await page.getByTestId('estimate-notice').isVisible()).toBe(true);
      await screenshot(page, 'own-or-hire-partner-desktop');
    });
  });

  it('refuses a custom rate at or below the variable cost on that field', async () => {
    await inFreshPage(browser, PHONE, 'own-or-hire-refused', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/estimates/own-or-hire`);
      await fill(page, 'Annual fixed cost', '1000');
      await fill(page, 'Custom rate', '4');
      await fill(page, 'Your variable cost', '4');
      await page.getByRole('button', { name: 'Find the break-even' }).click();
      await page.getByText('The custom rate must be above your variable cost per acre').waitFor();
      expect(await page.getByTestId('break-even-result').count()).toBe(0);
      await screenshot(page, 'own-or-hire-refused-phone');
    });
  });
});

describe('joint ownership planner', () => {
  it('splits a shared cost by use and names the one payment that squares it', async () => {
    await inFreshPage(browser, DESKTOP, 'joint-ownership', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/estimates/joint-ownership`);
      // A3-34 (Joint Machinery Ownership): with 1,000 and 500 acres of use the shares are 2/3 and 1/3.
      // Invented figures: $15,000 paid half each, so the heavier user owes the other $2,500.
      const names = page.getByLabel('Name', { exact: true });
      await names.nth(0).fill('Hill place');
      await names.nth(1).fill('Creek place');
      await page.getByLabel('Owns', { exact: true }).nth(0).fill('50');
      await page.getByLabel('Owns', { exact: true }).nth(1).fill('50');
      await page.getByLabel('Use', { exact: true }).nth(0).fill('1000');
      await page.getByLabel('Use', { exact: true }).nth(1).fill('500');
      await page.getByLabel('Amount', { exact: true }).nth(0).fill('15000');
      await page.getByLabel('Paid by Hill place', { exact: true }).nth(0).fill('7500');
      await page.getByLabel('Paid by Creek place', { exact: true }).nth(0).fill('7500');
      await page.getByRole('button', { name: 'Remove Repairs' }).click();
      await page.getByRole('button', { name: 'Work out the shares' }).click();

      const result = page.getByTestId('joint-ownership-result');
      await result.waitFor();
      const shares = result.getByTestId('shares');
      expect(await shares.getByRole('row', { name: /Hill place/ }).textContent()).toContain('$10,000.00');
      expect(await shares.getByRole('row', { name: /Creek place/ }).textContent()).toContain('$5,000.00');
      const transfer = page.getByTestId('transfers').getByRole('row').nth(1);
      expect(await transfer.textContent()).toBe('Hill placeCreek place$2,500.00');
      await screenshot(page, 'joint-ownership-owner-desktop');
    });
  });

  it('says on the spot when ownership does not add up to 100 %', async () => {
    await inFreshPage(browser, PHONE, 'joint-ownership-sum', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/estimates/joint-ownership`);
      await page.getByLabel('Owns', { exact: true }).nth(0).fill('60');
      await page.getByLabel('Owns', { exact: true }).nth(1).fill('30');
      await page.getByText('Ownership adds up to: 90.00 % of 100 %').waitFor();
      // Everything else is in order, so the only complaint is the ownership total.
      await page.getByLabel('Use', { exact: true }).nth(0).fill('100');
      await page.getByLabel('Use', { exact: true }).nth(1).fill('100');
      await page.getByLabel('Amount', { exact: true }).nth(0).fill('1000');
      await page.getByLabel('Paid by Household 1', { exact: true }).nth(0).fill('1000');
      await page.getByRole('button', { name: 'Remove Repairs' }).click();
      await page.getByRole('button', { name: 'Work out the shares' }).click();
      await page.getByText('Ownership must add up to 100 %; it adds up to 90 %').waitFor();
      await screenshot(page, 'joint-ownership-refused-phone');
    });
  });
});
