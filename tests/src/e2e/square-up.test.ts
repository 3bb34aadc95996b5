import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrlOrThrow, DEMO_PASSWORD, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, PHONE, screenshot, signInAndWait } from './browser.js';

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

  // Last in this file: it adds a closed period, which the tests above would otherwise also find.
  it('lets the partner close a period, record its transfer as paid, and then refuses edits dated in it', async () => {
    const { period, costDate } = await earlierSeasonWithOneCost();
    await inFreshPage(browser, DESKTOP, 'square-up-partner-close', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/square-ups`);
      await page.getByRole('button', { name: 'New period' }).click();
      const form = page.getByRole('dialog', { name: 'New square-up period' });
      await form.getByLabel('Name').fill(period.name);
      await form.getByLabel('From').fill(period.from);
      await form.getByLabel('To').fill(period.to);
      await form.getByRole('button', { name: 'Open the period' }).click();
      await page.getByTestId('households-table').waitFor();
      await page.getByRole('heading', { name: period.name }).waitFor();

      // Worked out by hand: the $840.00 insurance of a machine the two households own half and half
      // (fixed costs split by ownership shares) leaves the household that did not pay owing $420.00.
      const transfer = page.getByTestId('transfer');
      await transfer.first().waitFor();
      expect(await transfer.allTextContents()).toEqual(['Jonah & Ilse Quillback pays Arvid & Nell Quillback $420.00']);
      expect(await page.getByRole('button', { name: 'Record as paid' }).count()).toBe(0);

      await page.getByRole('button', { name: 'Close period' }).click();
      const closing = page.getByRole('dialog', { name: `Close ${period.name}?` });
      await closing.getByRole('button', { name: 'Close the period' }).click();
      await closing.waitFor({ state: 'hidden' });
      await page.getByText('These figures are frozen; corrections go into the next period.').waitFor();
      expect(await page.getByRole('button', { name: 'Close period' }).count()).toBe(0);

      await transfer.getByRole('button', { name: 'Record as paid' }).click();
      const paying = page.getByRole('dialog', { name: 'Record a transfer as paid' });
      await paying.getByText('Cheque', { exact: true }).click();
      await paying.getByLabel('Reference').fill('Cheque 3107');
      await paying.getByRole('button', { name: 'Record as paid' }).click();
      await paying.waitFor({ state: 'hidden' });
      const paid = transfer.getByTestId('transfer-paid');
      await paid.waitFor();
      expect((await paid.textContent())?.trim()).toMatch(/^Paid \d{4}-\d{2}-\d{2}, Cheque, Cheque 3107$/);
      await screenshot(page, 'square-up-partner-closed-and-paid');

      // The list shows the period closed with its one transfer paid.
      await page.goto(`${baseUrlOrThrow()}/square-ups`);
      const row = page.getByTestId('periods-table').locator('tbody tr').filter({ hasText: period.name });
      await row.waitFor();
      expect(await row.getByTestId('period-status').textContent()).toContain('Closed');
      expect(await row.textContent()).toContain('1 of 1');

      // A cost dated in the closed period is refused with the reason, and nothing is saved.
      await page.goto(`${baseUrlOrThrow()}/machines/${period.machineId}`);
      await page.getByRole('button', { name: 'Add a cost' }).click();
      const cost = page.getByRole('dialog', { name: 'Add a cost' });
      await cost.getByLabel('Date').fill(costDate);
      await cost.getByLabel('Amount').fill('65.00');
      await cost.getByRole('button', { name: 'Save cost' }).click();
      const refusal = cost.getByText(`${costDate} falls in the closed square-up "${period.name}"`, { exact: false });
      await refusal.waitFor();
      expect(await refusal.textContent()).toContain('record the correction in the next period');
      await screenshot(page, 'square-up-partner-closed-cost-refused');
      expect(await costsOn(period.machineId, costDate)).toBe(1);
    });
  });
});

/** The first day of the month `offset` months from this one, as the demo's periods are laid out. */
function monthStart(offset: number): Date {
  const now = new Date();
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() + offset, 1));
}
const isoDay = (d: Date) => d.toISOString().slice(0, 10);

async function apiSignIn(email: string): Promise<{ token: string; partyId: string }> {
  const base = baseUrlOrThrow();
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Requested-With': 'hitchbook', Origin: new URL(base).origin },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  expect(res.status).toBe(200);
  const body = (await res.json()) as { accessToken: string; user: { partyId: string } };
  return { token: body.accessToken, partyId: body.user.partyId };
}

async function partnerApi(path: string, init: { method?: string; body?: unknown } = {}): Promise<Response> {
  const { token } = await apiSignIn(DEMO_SIGN_INS.partner);
  return fetch(`${baseUrlOrThrow()}${path}`, {
    method: init.method ?? 'GET',
    headers: { Authorization: `Bearer ${token}`, ...(init.body ? { 'Content-Type': 'application/json' } : {}) },
    body: init.body ? JSON.stringify(init.body) : undefined,
  });
}

async function costsOn(machineId: string, day: string): Promise<number> {
  const res = await partnerApi(`/api/machines/${machineId}/costs?from=${day}&to=${day}`);
  expect(res.status).toBe(200);
  return ((await res.json()) as { total: number }).total;
}

/**
 * The demo's periods cover the last twelve months and the next six; the season before them is free.
 * The partner's household pays one insurance bill there on the combine it owns half of.
 */
async function earlierSeasonWithOneCost() {
  const from = monthStart(-24);
  const to = new Date(monthStart(-12).getTime() - 24 * 60 * 60 * 1000);
  const costDate = isoDay(new Date(monthStart(-18).getTime() + 9 * 24 * 60 * 60 * 1000));
  const { partyId } = await apiSignIn(DEMO_SIGN_INS.partner);
  const machines = (await (await partnerApi('/api/machines?pageSize=100')).json()) as { items: Array<{ id: string; name: string }> };
  const combine = machines.items.find((m) => m.name === 'Brakkefield C-890')!;
  const added = await partnerApi(`/api/machines/${combine.id}/costs`, {
    method: 'POST',
    body: { category: 'insurance', incurredOn: costDate, amount: '840.00', paidByPartyId: partyId, vendor: 'Prairie Mutual' },
  });
  expect(added.status).toBe(201);
  return { period: { name: 'Season before last', from: isoDay(from), to: isoDay(to), machineId: combine.id }, costDate };
}
