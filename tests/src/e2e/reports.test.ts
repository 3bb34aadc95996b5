import { readFile } from 'node:fs/promises';
import Papa from 'papaparse';
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

  it('lets the bookkeeper download the fleet as CSV, one row per machine on the screen, with nothing to change', async () => {
    await inFreshPage(browser, DESKTOP, 'year-end-bookkeeper-csv', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/year-end?year=${reportYear}`);
      const fleet = page.getByTestId('fleet-table');
      await fleet.getByTestId('fleet-row').first().waitFor();
      const shown = await fleet.getByTestId('fleet-row').locator('td:first-child button').allTextContents();
      expect(await page.getByRole('button', { name: /Accept suggested rates/ }).count()).toBe(0);

      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Rates CSV' }).click()]);
      expect(download.suggestedFilename()).toBe(`machine-rates-${reportYear}.csv`);
      const text = (await readFile((await download.path())!, 'utf8')).replace(/^\uFEFF/, '');
      const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
      expect(parsed.errors).toEqual([]);
      expect(parsed.meta.fields?.slice(0, 5)).toEqual(['Machine', 'Class', 'Status', 'Hours', 'Acres']);
      expect(parsed.data.map((r) => r.Machine).sort()).toEqual(shown.map((n) => n.trim()).sort());
      // Money and hours come as plain numbers a spreadsheet can add up.
      for (const row of parsed.data) {
        expect(row.Hours, row.Machine).toMatch(/^\d+(\.\d+)?$/);
        expect(row['Total cost'], row.Machine).toMatch(/^\d+(\.\d{2})?$/);
      }
      await screenshot(page, 'year-end-bookkeeper-after-csv');
    });
  });

  // Last in this file: it adds next year's family sheet, which the owner test above would see as current.
  it('turns the suggested rates the owner accepts into a new family rate sheet that carries them', async () => {
    await inFreshPage(browser, DESKTOP, 'year-end-owner-accept', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/year-end?year=${reportYear}`);
      await page.getByTestId('fleet-table').waitFor();
      await page.getByRole('button', { name: /Accept suggested rates/ }).click();
      const dialog = page.getByRole('dialog', { name: `Suggested rates for ${reportYear + 1}` });
      const rows = dialog.locator('tbody tr');
      await rows.first().waitFor();
      const offered = await rows.evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? '')));
      expect(offered.length).toBeGreaterThan(0);
      for (const [, , , suggested] of offered) expect(suggested).toMatch(/^\$[\d,]+\.\d{2}\/h$/);

      // Leave the last machine out: the sheet gets the suggested rates of the others only.
      const [, leftOut] = offered.at(-1)!;
      if (offered.length > 1) await dialog.getByRole('checkbox', { name: leftOut!, exact: true }).uncheck();
      const accepted = offered.length > 1 ? offered.slice(0, -1) : offered;
      await dialog.getByRole('button', { name: `Create the rate sheet with ${accepted.length} ${accepted.length === 1 ? 'rate' : 'rates'}` }).click();
      const done = dialog.getByTestId('accepted-rates');
      await done.waitFor();
      expect(await done.textContent()).toContain(`It starts on ${reportYear + 1}-01-01 with ${accepted.length} machine-hour`);
      const sheetName = /^(.+) is ready$/.exec((await done.locator('.mantine-Alert-title').textContent())?.trim() ?? '')?.[1];
      expect(sheetName).toBeTruthy();
      await screenshot(page, 'year-end-owner-accepted');

      await done.getByRole('link', { name: 'Open the new rate sheet' }).click();
      await page.getByRole('heading', { name: sheetName!, exact: true }).waitFor();
      await page.getByText(`In force from Jan 1, ${reportYear + 1}`).waitFor();
      await page.getByText('Machine-hour rates', { exact: true }).waitFor();
      for (const [, name, , suggested] of accepted) {
        const row = page.getByRole('row').filter({ has: page.getByRole('cell', { name: name!, exact: true }) });
        expect(await row.last().textContent(), name).toContain(suggested);
      }
      // The machine left out keeps the rate of the sheet in force.
      const [, keptName, keptNow] = offered.at(-1)!;
      if (offered.length > 1 && keptNow !== '—') {
        const kept = page.getByRole('row').filter({ has: page.getByRole('cell', { name: keptName!, exact: true }) });
        expect(await kept.last().textContent(), keptName).toContain(keptNow);
      }
      await screenshot(page, 'year-end-owner-new-rate-sheet');

      // The new sheet is listed among the rate sheets.
      await page.goto(`${baseUrlOrThrow()}/rates`);
      await page.getByRole('link', { name: sheetName!, exact: true }).waitFor();
      await screenshot(page, 'year-end-owner-rate-sheets');
    });
  });
});
