import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Dec } from '@hitchbook/shared/decimal';
import { formatMoney } from '@hitchbook/shared/money';
import { apiCall, apiToken, baseUrlOrThrow, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, navigationLabels, PHONE, screenshot, signInAndWait } from './browser.js';

interface InvoiceJson {
  id: string;
  kind: string;
  numberLabel: string | null;
  partyName: string;
  status: string;
  state: string;
  balance: string;
}

/**
 * An invoice customer@ still owes on. The demo issues one; should another scenario have paid it,
 * the owner issues one more from the neighbour's next unbilled day of work.
 */
async function openInvoiceOfCustomer(): Promise<InvoiceJson> {
  const customer = await apiToken(DEMO_SIGN_INS.customer);
  const mine = await apiCall<{ items: InvoiceJson[] }>(customer, 'GET', '/api/invoices?state=issued,overdue,partly-paid&pageSize=50');
  const open = mine.items.find((i) => i.kind === 'invoice' && new Dec(i.balance).gt(0));
  if (open) return open;
  const owner = await apiToken(DEMO_SIGN_INS.owner);
  const partyId = (await apiCall<{ partyId: string }>(customer, 'GET', '/api/auth/me')).partyId;
  const entries = await apiCall<{ items: Array<{ workDate: string }> }>(owner, 'GET', `/api/work-entries?billToPartyId=${partyId}&state=approved&sort=date&pageSize=1`);
  const day = entries.items[0]?.workDate;
  if (!day) throw new Error('customer@ has no open invoice and no approved work left to bill');
  const draft = await apiCall<{ id: string; version: number }>(owner, 'POST', '/api/invoices/drafts', { partyId, from: day, to: day });
  return apiCall<InvoiceJson>(owner, 'POST', `/api/invoices/${draft.id}/issue`, { version: draft.version }, { 'Idempotency-Key': crypto.randomUUID() });
}

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe("the customer's own view", () => {
  it('lists only their own invoices and keeps the rest of the operation out of sight', async () => {
    const otherCustomers = await apiCall<{ items: InvoiceJson[] }>(await apiToken(DEMO_SIGN_INS.customer2), 'GET', '/api/invoices');
    const theirs = otherCustomers.items[0];
    if (!theirs) throw new Error('customer2@ has no invoice in the demo');

    await inFreshPage(browser, DESKTOP, 'my-invoices-customer', async ({ page, foreignRequests }) => {
      await signInAndWait(page, DEMO_SIGN_INS.customer);
      expect(await navigationLabels(page)).toEqual(['Dashboard', 'My invoices', 'Account']);
      await page.getByTestId('main-nav').getByText('My invoices', { exact: true }).click();
      await page.getByRole('heading', { name: 'My invoices' }).waitFor();
      const rows = page.getByRole('row');
      await rows.nth(1).waitFor();
      expect(await page.getByText(theirs.numberLabel!, { exact: true }).count()).toBe(0);
      await screenshot(page, 'my-invoices-customer-desktop');

      // Another customer's invoice, opened by its address, does not exist for this sign-in.
      await page.goto(`${baseUrlOrThrow()}/my-invoices/${theirs.id}`);
      await page.getByTestId('not-found').waitFor();
      // The staff screens are closed to a customer.
      await page.goto(`${baseUrlOrThrow()}/invoices`);
      await page.getByTestId('not-allowed').waitFor();
      await page.goto(`${baseUrlOrThrow()}/rates`);
      await page.getByTestId('not-allowed').waitFor();
      expect(foreignRequests).toEqual([]);
    });
  });

  it('leaves the invoice open with a clear message when the card is declined', async () => {
    const invoice = await openInvoiceOfCustomer();
    await inFreshPage(browser, PHONE, 'card-declined-customer', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.customer);
      await page.goto(`${baseUrlOrThrow()}/my-invoices/${invoice.id}`);
      const owed = formatMoney(invoice.balance);
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download PDF' }).click()]);
      expect(download.suggestedFilename()).toBe(`${invoice.numberLabel}.pdf`);
      await page.getByRole('button', { name: `Pay ${owed} by card` }).click();
      await page.getByLabel('Card number').fill('4000 0000 0000 0002');
      await page.getByLabel('Expiry').fill('12 / 34');
      await page.getByLabel('CVC').fill('123');
      await page.getByRole('button', { name: /^Pay / }).click();
      await page.getByRole('alert').getByText('Your card was declined.').waitFor();
      await page.getByRole('link', { name: 'Cancel and go back' }).click();

      await page.getByRole('heading', { name: 'No payment was made' }).waitFor();
      await page.getByText(`Nothing was charged; ${owed} is still open on invoice ${invoice.numberLabel}.`).waitFor();
      expect(await page.getByRole('button', { name: 'Try again' }).count()).toBe(1);
      await screenshot(page, 'card-declined-customer-phone');
    });
    const after = await apiCall<InvoiceJson>(await apiToken(DEMO_SIGN_INS.owner), 'GET', `/api/invoices/${invoice.id}`);
    expect(after).toMatchObject({ balance: invoice.balance, state: invoice.state });
  }, 120_000);
});
