import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrlOrThrow, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, PHONE, screenshot, signInAndWait } from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** "$1,234.56" or "-$1,234.56" as whole cents, so sums of screen figures are exact. */
function centsOf(text: string): bigint {
  const trimmed = text.trim();
  const match = /^(-?)\$([\d,]+)\.(\d{2})$/.exec(trimmed);
  if (!match) throw new Error(`not a money figure: "${trimmed}"`);
  const cents = BigInt(match[2]!.replaceAll(',', '') + match[3]);
  return match[1] ? -cents : cents;
}

/** The demo keeps last season closed and this season, covering today, open. */
async function openPeriod(page: Page, status: 'Open' | 'Closed'): Promise<void> {
  await page.goto(`${baseUrlOrThrow()}/square-ups`);
  const row = page.getByTestId('periods-table').locator('tbody tr').filter({ has: page.getByTestId('period-status').getByText(status, { exact: true }) });
  await row.getByRole('link').first().click();
  await page.getByTestId('households-table').waitFor();
}

async function balances(page: Page): Promise<bigint[]> {
  const cells = await page.getByTestId('household-row').locator('[data-figure="balance"]').allTextContents();
  return cells.map(centsOf);
}

describe('square-up statement', () => {
  it('shows the partner each household’s balance, squaring to zero, and the transfers that settle them', async () => {
    await inFreshPage(browser, DESKTOP, 'square-up-partner', async ({ page, foreignRequests }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await openPeriod(page, 'Open');
      const owed = await balances(page);
      expect(owed.length).toBe(3);
      expect(owed.reduce((a, b) => a + b, 0n)).toBe(0n);
      expect((await page.locator('[data-total="balance"]').textContent())?.trim()).toBe('$0.00');

      // The fewest transfers move exactly what the households are owed.
      const transfers = page.getByTestId('transfer');
      expect(await transfers.count()).toBeGreaterThan(0);
      const moved = (await transfers.allTextContents()).map((text) => {
        expect(text).toMatch(/ pays .+\$[\d,]+\.\d{2}/);
        return centsOf(/(\$[\d,]+\.\d{2})/.exec(text)![1]!);
      });
      const positive = owed.filter((c) => c > 0n).reduce((a, b) => a + b, 0n);
      expect(moved.reduce((a, b) => a + b, 0n)).toBe(positive);

      // The chart is a lazy chunk that draws after the table: wait for its bars before counting them.
      await expect.poll(() => page.locator('.recharts-bar-rectangle').count(), { timeout: 20000 }).toBe(3);
      expect(await page.getByRole('button', { name: 'Close period' }).isVisible()).toBe(true);
      await screenshot(page, 'square-up-partner-desktop');

      // A household's "paid" opens the cost entries behind it.
      await page.getByTestId('household-row').first().locator('[data-figure="paid"] button').click();
      await page.getByTestId('cost-lines').waitFor();
      expect(await page.getByTestId('cost-lines').locator('tbody tr').count()).toBeGreaterThan(0);
      await screenshot(page, 'square-up-partner-drill-down');
      await page.getByRole('tab', { name: 'Work entries' }).click();
      await page.getByTestId('work-lines').waitFor();
      expect(await page.getByTestId('work-lines').locator('tbody tr').count()).toBeGreaterThan(0);
      expect(foreignRequests).toEqual([]);
    });
  });

  it('fits the statement on a phone', async () => {
    await inFreshPage(browser, PHONE, 'square-up-partner-phone', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await openPeriod(page, 'Open');
      await page.getByTestId('transfer').first().waitFor();
      // Wide tables scroll inside their card; the page itself never scrolls sideways.
      expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
      await screenshot(page, 'square-up-partner-phone');
    });
  });

  it('lets the bookkeeper read a closed period without record or close controls', async () => {
    await inFreshPage(browser, DESKTOP, 'square-up-bookkeeper', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/square-ups`);
      await page.getByTestId('periods-table').waitFor();
      expect(await page.getByRole('button', { name: 'New period' }).count()).toBe(0);

      await openPeriod(page, 'Closed');
      expect((await balances(page)).reduce((a, b) => a + b, 0n)).toBe(0n);
      expect(await page.getByTestId('transfer').count()).toBeGreaterThan(0);
      expect(await page.getByRole('button', { name: 'Record as paid' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'Close period' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'CSV' }).isVisible()).toBe(true);
      await screenshot(page, 'square-up-bookkeeper-closed-desktop');

      await openPeriod(page, 'Open');
      expect(await page.getByRole('button', { name: 'Close period' }).count()).toBe(0);
    });
  });
});
