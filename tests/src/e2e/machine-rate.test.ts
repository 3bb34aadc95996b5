import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrlOrThrow, DEMO_SIGN_INS, launchBrowser, openPage, PHONE, screenshot, signInAndWait } from './browser.js';

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

/**
 * Trade reference §6a: Iowa State AgDM A3-29 (2015) tractor, 180 max-PTO-hp diesel, list $150,000,
 * purchase $130,000, 15 years at 400 h/yr, 8 % interest, salvage 23 % of list ($34,500), TIH 1 % of
 * average value, lubrication 15 % of fuel, labour factor 1.1. Fuel $3.00/gal and wage $15.00/h are the
 * reference's test choices. Computed there: $86.97 per hour (ownership $36.85 + operating $50.12), and
 * $4.02 per acre pulling a 30-ft field cultivator at 7 mph and 85 % field efficiency.
 */
async function enterA329Tractor(page: Page) {
  await page.getByRole('textbox', { name: 'Machine class' }).click();
  await page.getByRole('option', { name: 'Tractor, two-wheel drive' }).click();
  await fill(page, 'List price', '150000');
  await fill(page, 'Purchase price', '130000');
  await fill(page, 'Years owned', '15');
  await fill(page, 'Use per year', '400');
  await fill(page, 'Interest rate', '8');
  await fill(page, 'Trade-in value (optional)', '34500');
  await fill(page, 'PTO horsepower', '180');
  await fill(page, 'Fuel price', '3.00');
  await fill(page, 'Operator wage', '15.00');
}

describe('machine-hour rate estimate', () => {
  it('computes the A3-29 tractor at $86.97 an hour for the owner', async () => {
    const { context, page } = await openPage(browser);
    try {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/estimates/machine-rate`);
      await page.getByTestId('method-note').waitFor();
      expect(await page.getByTestId('method-note').textContent()).toContain(
        'ASABE D497.7 / EP496.3 as used in Iowa State Extension AgDM A3-29',
      );
      expect(await page.getByTestId('estimate-notice').textContent()).toContain('not tax');

      await enterA329Tractor(page);
      await fill(page, 'Width', '30');
      await fill(page, 'Speed', '7');
      await fill(page, 'Efficiency', '85');
      await page.getByRole('button', { name: 'Work out the rate' }).click();

      await page.getByTestId('machine-rate-result').waitFor();
      expect(await page.getByTestId('total-per-hour').textContent()).toBe('$86.97');
      const breakdown = page.getByTestId('cost-breakdown');
      expect(await breakdown.locator('[data-row=ownership] td').nth(2).textContent()).toBe('$36.85');
      expect(await breakdown.locator('[data-row=operating] td').nth(2).textContent()).toBe('$50.12');
      expect(await page.getByTestId('total-per-acre').textContent()).toBe('$4.02');
      await page.locator('.recharts-bar-rectangle').first().waitFor();
      await screenshot(page, 'machine-rate-owner-desktop');
    } finally {
      await context.close();
    }
  });

  it('refuses a purchase price above list with the shared rule’s words, on the phone', async () => {
    const { context, page } = await openPage(browser, PHONE);
    try {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/estimates/machine-rate`);
      await enterA329Tractor(page);
      // A purchase above list price is refused by the shared request rules.
      await fill(page, 'Purchase price', '160000');
      await page.getByRole('button', { name: 'Work out the rate' }).click();
      const error = page.getByText('The purchase price is above the list price of an equivalent new machine');
      await error.waitFor();
      expect(await page.getByTestId('machine-rate-result').count()).toBe(0);
      await screenshot(page, 'machine-rate-invalid-phone');
    } finally {
      await context.close();
    }
  });
});
