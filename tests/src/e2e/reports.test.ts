import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrlOrThrow, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, PHONE, screenshot, signInAndWait } from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

// The demo's costs and work fill the months before this one, so last month's year always has figures.
const reportYear = new Date(Date.now() - 31 * 24 * 60 * 60 * 1000).getUTCFullYear();

describe('year-end machine rates', () => {
  it('shows the bookkeeper the fleet table, its charts and the estimate notice, without accepting rates', async () => {
    await inFreshPage(browser, DESKTOP, 'year-end-bookkeeper', async ({ page, foreignRequests }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/year-end?year=${reportYear}`);
      const fleet = page.getByTestId('fleet-table');
      await fleet.waitFor();
      expect(await fleet.getByTestId('fleet-row').count()).toBeGreaterThan(5);
      // Every machine that worked shows its hours and an actual rate per hour.
      expect(await fleet.locator('tbody').textContent()).toMatch(/\$[\d,]+\.\d{2}\/h/);
      // A drawn bar is a path; categories a machine spent nothing on leave empty groups.
      await page.getByTestId('cost-per-hour-chart').locator('path.recharts-rectangle').first().waitFor();
      await page.getByTestId('hours-chart').locator('path.recharts-rectangle').first().waitFor();
      expect(await page.getByTestId('estimate-notice').textContent()).toContain('not tax, legal or accounting advice');
      expect(await page.getByTestId('method-note').textContent()).toContain('ASABE D497.7 / EP496.3 as used in Iowa State Extension AgDM A3-29');
      expect(await page.getByRole('button', { name: /Accept suggested rates/ }).count()).toBe(0);
      await page.getByTestId('custom-income').waitFor();
      await page.getByTestId('field-costs').waitFor();
      await screenshot(page, 'year-end-bookkeeper-desktop');

      // A machine's detail lists the estimate's inputs and where each came from.
      await fleet.getByTestId('fleet-row').first().getByRole('button').click();
      await page.getByTestId('detail-inputs').waitFor();
      expect(await page.getByTestId('detail-inputs').textContent()).toContain('List price');
      await screenshot(page, 'year-end-bookkeeper-machine-detail');
      expect(foreignRequests).toEqual([]);
    });
  });

  it('offers the owner the suggested rates to accept, machine by machine', async () => {
    await inFreshPage(browser, PHONE, 'year-end-owner-phone', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/year-end?year=${reportYear}`);
      await page.getByTestId('fleet-table').waitFor();
      expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
      await screenshot(page, 'year-end-owner-phone');
      await page.getByRole('button', { name: /Accept suggested rates/ }).click();
      const create = page.getByRole('button', { name: /Create the rate sheet with \d+ rates/ });
      await create.waitFor();
      await screenshot(page, 'year-end-owner-accept-phone');
      // Unticking every machine leaves nothing to accept.
      await page.getByRole('checkbox', { name: 'All machines' }).uncheck();
      expect(await page.getByRole('button', { name: /Create the rate sheet with 0 rates/ }).isDisabled()).toBe(true);
    });
  });
});
