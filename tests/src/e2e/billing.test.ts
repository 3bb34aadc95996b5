import { readFile } from 'node:fs/promises';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Dec } from '@hitchbook/shared/decimal';
import { formatMoney } from '@hitchbook/shared/money';
import {
  baseUrlOrThrow,
  DEMO_PASSWORD,
  DEMO_SIGN_INS,
  DESKTOP,
  inFreshPage,
  launchBrowser,
  PHONE,
  screenshot,
  signInAndWait,
} from './browser.js';

// The neighbour whose sign-in is customer@hitchbook.test (packages/db/src/demo/people.ts).
const NEIGHBOUR = 'Marisol Brandvold';
const NEIGHBOUR_EMAIL = 'marisol@brandvold.example';

interface Page_<T> {
  items: T[];
  total: number;
}

interface InvoiceJson {
  id: string;
  numberLabel: string | null;
  total: string;
  balance: string;
  state: string;
  lines: Array<{ kind: string; description: string; amount: string }>;
}

function mailApiUrlOrThrow(): string {
  const url = process.env.MAIL_API_URL;
  if (!url) throw new Error('MAIL_API_URL is not set: run the browser tests with "npm test", which starts the mail catcher.');
  return url.replace(/\/$/, '');
}

async function apiAs(email: string) {
  const base = baseUrlOrThrow();
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  expect(login.status).toBe(200);
  const { accessToken } = (await login.json()) as { accessToken: string };
  return async <T>(path: string): Promise<T> => {
    const res = await fetch(`${base}${path}`, { headers: { Authorization: `Bearer ${accessToken}` } });
    expect(res.status, `GET ${path}`).toBe(200);
    return (await res.json()) as T;
  };
}

/**
 * The earliest day on which the neighbour has approved work that no invoice holds yet. Billing only
 * that day leaves the rest of their work to other scenarios, and a rerun simply takes the next day.
 */
async function nextUnbilledDay(): Promise<{ partyId: string; day: string; fields: string[] }> {
  const get = await apiAs(DEMO_SIGN_INS.owner);
  const parties = await get<Page_<{ id: string; name: string }>>(`/api/parties?kind=customer&q=${encodeURIComponent(NEIGHBOUR)}`);
  const party = parties.items.find((p) => p.name === NEIGHBOUR);
  if (!party) throw new Error(`the demo has no customer named ${NEIGHBOUR}`);
  const query = `billToPartyId=${party.id}&state=approved&sort=date&pageSize=200`;
  const entries = await get<Page_<{ workDate: string; fieldName: string }>>(`/api/work-entries?${query}`);
  const first = entries.items[0];
  if (!first) throw new Error(`${NEIGHBOUR} has no approved, unbilled work left in the demo`);
  const fields = entries.items.filter((e) => e.workDate === first.workDate).map((e) => e.fieldName);
  return { partyId: party.id, day: first.workDate, fields };
}

async function waitForInvoiceMail(numberLabel: string): Promise<{ links: string[]; attachments: Array<{ filename: string }> }> {
  const base = mailApiUrlOrThrow();
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    const list = (await (await fetch(`${base}/api/messages?to=${encodeURIComponent(NEIGHBOUR_EMAIL)}`)).json()) as Array<{ id: string; subject: string }>;
    const message = list.find((m) => m.subject.includes(numberLabel));
    if (message) return (await (await fetch(`${base}/api/messages/${message.id}`)).json()) as { links: string[]; attachments: Array<{ filename: string }> };
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`no e-mail for ${numberLabel} reached ${NEIGHBOUR_EMAIL} within 30 s`);
}

/** "May 2, 2026", as the screens print a calendar day. */
function printedDay(iso: string): string {
  return new Date(`${iso}T12:00:00`).toLocaleDateString('en-US', { month: 'short', day: 'numeric', year: 'numeric' });
}

/** The option list re-renders while its data arrives, so a click can land on a detached node; reopen and retry. */
async function pickOption(page: Page, label: string, option: string) {
  const box = page.getByRole('textbox', { name: label, exact: true });
  for (let attempt = 1; ; attempt++) {
    await box.click();
    try {
      await page.getByRole('option', { name: option, exact: true }).click({ timeout: 10000 });
    } catch (err) {
      if (attempt >= 3) throw err;
      await page.keyboard.press('Escape');
      continue;
    }
    // The choice only counts once the box shows it.
    if ((await box.inputValue()) === option) return;
    if (attempt >= 3) throw new Error(`${label} shows "${await box.inputValue()}" instead of "${option}"`);
  }
}

/** Drafts an invoice for the neighbour's work on one day through the New invoice screen. */
async function draftInBrowser(page: Page, day: string): Promise<string> {
  await page.goto(`${baseUrlOrThrow()}/invoices/new`);
  await pickOption(page, 'Customer', NEIGHBOUR);
  await page.getByLabel('Work from', { exact: true }).fill(day);
  await page.getByLabel('Work to', { exact: true }).fill(day);
  await page.getByRole('button', { name: 'Preview invoice' }).click();
  await page.getByRole('heading', { name: `Draft invoice for ${NEIGHBOUR}` }).waitFor();
  return new URL(page.url()).pathname.split('/').at(-1)!;
}

/** Issues the draft on screen and answers its new number. */
async function issueInBrowser(page: Page): Promise<string> {
  await page.getByTestId('issue-invoice').click();
  await page.getByRole('dialog', { name: 'Issue this invoice?' }).getByRole('button', { name: 'Issue invoice' }).click();
  const heading = page.getByRole('heading', { name: /^Invoice INV-\d+$/ });
  await heading.waitFor();
  return (await heading.textContent())!.replace('Invoice ', '');
}

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('billing a neighbour and getting paid by card', () => {
  it('lets the owner draft, adjust, issue and e-mail an invoice that the neighbour pays with a test card', async () => {
    const { day, fields } = await nextUnbilledDay();
    let invoiceId = '';
    let numberLabel = '';
    let payLink = '';

    await inFreshPage(browser, DESKTOP, 'billing-owner', async ({ page, foreignRequests }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.getByTestId('main-nav').getByText('Invoices', { exact: true }).click();
      await page.getByRole('link', { name: 'New invoice' }).click();
      // The list stays on screen while the new page's code loads, and its filter is also labelled Customer.
      await page.getByRole('heading', { name: 'New invoice', level: 1 }).waitFor();
      await pickOption(page, 'Customer', NEIGHBOUR);
      await page.getByText(/approved (entry waits|entries wait) to be billed/).waitFor();
      await page.getByLabel('Work from', { exact: true }).fill(day);
      await page.getByLabel('Work to', { exact: true }).fill(day);
      await screenshot(page, 'invoice-new-owner-desktop');
      await page.getByRole('button', { name: 'Preview invoice' }).click();

      await page.getByRole('heading', { name: `Draft invoice for ${NEIGHBOUR}` }).waitFor();
      invoiceId = new URL(page.url()).pathname.split('/').at(-1)!;
      const lines = page.getByTestId('invoice-lines');
      await lines.getByText(printedDay(day)).first().waitFor();
      for (const field of fields) expect(await lines.getByText(field).count()).toBeGreaterThan(0);

      const get = await apiAs(DEMO_SIGN_INS.owner);
      const priced = await get<InvoiceJson>(`/api/invoices/${invoiceId}`);
      expect(await page.getByTestId('invoice-total').textContent()).toBe(formatMoney(priced.total));

      await page.getByRole('button', { name: 'Add a line' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Description', { exact: true }).fill('Tarp for the bale stack');
      await dialog.getByLabel('Quantity', { exact: true }).fill('2');
      await dialog.getByLabel('Unit', { exact: true }).fill('each');
      await dialog.getByLabel('Rate', { exact: true }).fill('12.50');
      await dialog.getByRole('button', { name: 'Add line' }).click();
      await dialog.waitFor({ state: 'hidden' });
      await lines.getByText('Tarp for the bale stack').waitFor();
      // The server adds 2 × $12.50 to the total it priced; the screen shows its figure.
      const adjusted = await get<InvoiceJson>(`/api/invoices/${invoiceId}`);
      expect(adjusted.lines.find((l) => l.kind === 'adjustment')).toMatchObject({ description: 'Tarp for the bale stack', amount: '25.00' });
      expect(new Dec(adjusted.total).minus(priced.total).toFixed(2)).toBe('25.00');
      await expect.poll(() => page.getByTestId('invoice-total').textContent()).toBe(formatMoney(adjusted.total));
      await screenshot(page, 'invoice-draft-owner-desktop');

      await page.getByTestId('issue-invoice').click();
      const confirm = page.getByRole('dialog', { name: 'Issue this invoice?' });
      await confirm.getByText('The numbers are final').waitFor();
      await confirm.getByText(/cannot be edited afterwards/).waitFor();
      await screenshot(page, 'invoice-issue-confirm-owner-desktop');
      await confirm.getByRole('button', { name: 'Issue invoice' }).click();
      const heading = page.getByRole('heading', { name: /^Invoice INV-\d+$/ });
      await heading.waitFor();
      numberLabel = (await heading.textContent())!.replace('Invoice ', '');
      expect(await page.getByTestId('invoice-state').textContent()).toBe('Issued');
      // Issued invoices are never edited: the draft's controls are gone.
      expect(await page.getByRole('button', { name: 'Add a line' }).count()).toBe(0);

      await page.getByRole('button', { name: 'Send by e-mail' }).click();
      const send = page.getByRole('dialog');
      expect(await send.getByLabel('Send to', { exact: true }).inputValue()).toBe(NEIGHBOUR_EMAIL);
      await send.getByRole('button', { name: 'Send e-mail' }).click();
      await page.getByText(`${numberLabel} is on its way`).waitFor();
      await screenshot(page, 'invoice-issued-owner-desktop');
      expect(foreignRequests).toEqual([]);
    });

    const mail = await waitForInvoiceMail(numberLabel);
    expect(mail.attachments.map((a) => a.filename)).toContain(`${numberLabel}.pdf`);
    payLink = mail.links.find((l) => l.endsWith(`/pay/${invoiceId}`)) ?? '';
    expect(payLink, `pay link in ${JSON.stringify(mail.links)}`).not.toBe('');

    await inFreshPage(browser, PHONE, 'billing-customer-pays', async ({ page }) => {
      await page.goto(payLink);
      // Signed out, the link asks for a sign-in and then goes on to the invoice.
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      expect(new URL(page.url()).searchParams.get('next')).toBe(`/pay/${invoiceId}`);
      await page.getByLabel('E-mail').fill(DEMO_SIGN_INS.customer);
      await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('heading', { name: `Invoice ${numberLabel}` }).waitFor();
      expect(new URL(page.url()).pathname).toBe(`/my-invoices/${invoiceId}`);
      await page.getByTestId('work-entries').getByText(printedDay(day)).first().waitFor();
      await screenshot(page, 'my-invoice-customer-phone');

      const balance = (await page.getByTestId('invoice-balance').textContent())!;
      await page.getByRole('button', { name: `Pay ${balance} by card` }).click();
      // The card page charges the balance the server holds, to the cent.
      await page.getByLabel('Card number').waitFor();
      const charged = `${balance.replace('$', '')} USD`;
      expect(await page.getByTestId('amount').textContent()).toBe(charged);
      await screenshot(page, 'card-checkout-customer-phone');
      await page.getByLabel('Card number').fill('4242 4242 4242 4242');
      await page.getByLabel('Expiry').fill('12 / 34');
      await page.getByLabel('CVC').fill('123');
      await page.getByRole('button', { name: `Pay ${charged}` }).click();

      // Back in Hitchbook: the page waits for the signed webhook to record the payment.
      await page.getByRole('heading', { name: /Payment being confirmed|Paid — thank you/ }).waitFor();
      expect(new URL(page.url()).pathname).toBe(`/pay/${invoiceId}`);
      await page.getByRole('heading', { name: 'Paid — thank you' }).waitFor({ timeout: 45_000 });
      await page.getByText(`${balance} paid by card on invoice ${numberLabel}.`).waitFor();
      await screenshot(page, 'payment-confirmed-customer-phone');
      await page.getByRole('link', { name: 'See the invoice' }).click();
      await page.getByRole('heading', { name: `Invoice ${numberLabel}` }).waitFor();
      expect(await page.getByTestId('invoice-state').textContent()).toBe('Paid');
      expect(await page.getByTestId('invoice-balance').textContent()).toBe('$0.00');
      expect(await page.getByRole('button', { name: /^Pay / }).count()).toBe(0);
      await page.getByTestId('payments').getByText(balance).waitFor();
      await screenshot(page, 'my-invoice-paid-customer-phone');
    });

    const standing = await (await apiAs(DEMO_SIGN_INS.owner))<InvoiceJson>(`/api/invoices/${invoiceId}`);
    expect(standing).toMatchObject({ state: 'paid', balance: '0.00' });

    // The owner hands part of the card payment back; the invoice owes that part again.
    await inFreshPage(browser, DESKTOP, 'billing-owner-refund', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/invoices/${invoiceId}`);
      const paymentsPanel = page.getByTestId('payments');
      await paymentsPanel.getByRole('button', { name: 'Refund' }).click();
      const refund = page.getByRole('dialog', { name: 'Refund a card payment' });
      await refund.getByLabel('Amount to refund').fill('10.00');
      await refund.getByLabel('Reason').fill('Tarps came back unused');
      await refund.getByRole('button', { name: 'Refund to card' }).click();
      await refund.waitFor({ state: 'hidden' });
      await paymentsPanel.getByText('$10.00 refunded').waitFor();
      await expect.poll(() => page.getByTestId('invoice-state').textContent()).toBe('Partly paid');
      await screenshot(page, 'invoice-refunded-owner-desktop');
    });
    const refunded = await (await apiAs(DEMO_SIGN_INS.owner))<InvoiceJson>(`/api/invoices/${invoiceId}`);
    expect(refunded).toMatchObject({ state: 'partly-paid', balance: '10.00' });
  }, 240_000);
});

describe('correcting an issued invoice', () => {
  it('takes a discount, a part payment by cheque up to the balance, and a credit note for the rest', async () => {
    const { day } = await nextUnbilledDay();
    await inFreshPage(browser, DESKTOP, 'billing-corrections', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      const id = await draftInBrowser(page, day);
      const get = await apiAs(DEMO_SIGN_INS.owner);

      await page.getByRole('button', { name: 'Discount' }).click();
      const discount = page.getByRole('dialog');
      await discount.getByText('A percentage', { exact: true }).click();
      await discount.getByLabel('Description', { exact: true }).fill('Good neighbour');
      await discount.getByLabel('Percent off', { exact: true }).fill('10');
      await discount.getByRole('button', { name: 'Save discount' }).click();
      await discount.waitFor({ state: 'hidden' });
      const discounted = await get<InvoiceJson & { subtotal: string }>(`/api/invoices/${id}`);
      // Ten percent of the subtotal, rounded to the cent by the server, comes off the total.
      const expectedTotal = new Dec(discounted.subtotal).minus(new Dec(discounted.subtotal).times('0.1').toDecimalPlaces(2, Dec.ROUND_HALF_UP));
      expect(discounted.total).toBe(expectedTotal.toFixed(2));
      await expect.poll(() => page.getByTestId('invoice-total').textContent()).toBe(formatMoney(discounted.total));
      await page.getByText('Discount: Good neighbour').waitFor();

      const numberLabel = await issueInBrowser(page);
      const total = discounted.total;

      await page.getByRole('button', { name: 'Record payment' }).click();
      const payment = page.getByRole('dialog', { name: `Record a payment on ${numberLabel}` });
      expect(await payment.getByLabel('Amount', { exact: true }).inputValue()).toBe(total);
      await payment.getByLabel('Amount', { exact: true }).fill(new Dec(total).plus('0.01').toFixed(2));
      await payment.getByRole('button', { name: 'Record payment' }).click();
      await payment.getByText(`At most the open balance of ${formatMoney(total)}.`).waitFor();
      const part = new Dec(total).div(2).toDecimalPlaces(2, Dec.ROUND_DOWN);
      await payment.getByLabel('Amount', { exact: true }).fill(part.toFixed(2));
      await payment.getByLabel('Reference', { exact: true }).fill('Cheque 3141');
      await payment.getByRole('button', { name: 'Record payment' }).click();
      await payment.waitFor({ state: 'hidden' });
      await page.getByTestId('payments').getByText('Cheque 3141').waitFor();
      await expect.poll(() => page.getByTestId('invoice-state').textContent()).toBe('Partly paid');
      const rest = new Dec(total).minus(part).toFixed(2);
      expect(await page.getByTestId('invoice-balance').textContent()).toBe(formatMoney(rest));
      await screenshot(page, 'invoice-partly-paid-owner-desktop');

      await page.getByRole('button', { name: 'Correct' }).click();
      // Money was received, so the invoice can no longer be voided; it is corrected by a credit note.
      expect(await page.getByRole('menuitem', { name: 'Void invoice…' }).count()).toBe(0);
      await page.getByRole('menuitem', { name: 'Credit note…' }).click();
      const credit = page.getByRole('dialog');
      await credit.getByText('An amount', { exact: true }).click();
      await credit.getByLabel('Reason', { exact: true }).fill('Logged twice by the cab and the office');
      await credit.getByLabel('Line description', { exact: true }).fill('Work logged twice');
      await credit.getByLabel('Amount to credit', { exact: true }).fill(rest);
      await credit.getByRole('button', { name: 'Issue credit note' }).click();
      await page.getByRole('heading', { name: /^Credit note CN-\d+$/ }).waitFor();
      await page.getByText(`Corrects invoice ${numberLabel}: Logged twice by the cab and the office`).waitFor();
      await screenshot(page, 'credit-note-owner-desktop');

      await page.getByRole('link', { name: numberLabel, exact: true }).click();
      await page.getByRole('heading', { name: `Invoice ${numberLabel}` }).waitFor();
      expect(await page.getByTestId('invoice-balance').textContent()).toBe('$0.00');
      expect(await page.getByRole('button', { name: 'Record payment' }).count()).toBe(0);
      expect(await get<InvoiceJson>(`/api/invoices/${id}`)).toMatchObject({ state: 'paid', balance: '0.00' });
    });
  });

  it('voids an invoice issued by mistake and frees its work for another invoice', async () => {
    const { partyId, day } = await nextUnbilledDay();
    await inFreshPage(browser, PHONE, 'billing-void', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await draftInBrowser(page, day);
      await screenshot(page, 'invoice-draft-owner-phone');
      const numberLabel = await issueInBrowser(page);
      await page.getByRole('button', { name: 'Correct' }).click();
      await page.getByRole('menuitem', { name: 'Void invoice…' }).click();
      const dialog = page.getByRole('dialog', { name: `Void ${numberLabel}?` });
      await dialog.getByRole('button', { name: 'Void invoice' }).click();
      await dialog.getByText('Required.', { exact: true }).waitFor();
      await dialog.getByLabel('Reason', { exact: true }).fill('Billed to the wrong neighbour');
      await dialog.getByRole('button', { name: 'Void invoice' }).click();
      await dialog.waitFor({ state: 'hidden' });
      await expect.poll(() => page.getByTestId('invoice-state').textContent()).toBe('Void');
      await page.getByText('Billed to the wrong neighbour', { exact: false }).waitFor();
      await screenshot(page, 'invoice-void-owner-phone');
    });
    // The day's work is unbilled again, so the next invoice can take it.
    const get = await apiAs(DEMO_SIGN_INS.owner);
    const freed = await get<Page_<{ workDate: string }>>(`/api/work-entries?billToPartyId=${partyId}&state=approved&dateFrom=${day}&dateTo=${day}`);
    expect(freed.total).toBeGreaterThan(0);
  });
});

describe('the bookkeeper', () => {
  it('reads invoices and their payments without any billing controls', async () => {
    await inFreshPage(browser, DESKTOP, 'invoices-bookkeeper', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/invoices?state=paid`);
      const paid = page.getByRole('link', { name: 'INV-0001', exact: true });
      await paid.waitFor();
      expect(await page.getByRole('link', { name: 'New invoice' }).count()).toBe(0);
      await screenshot(page, 'invoices-bookkeeper-desktop');
      await paid.click();
      await page.getByRole('heading', { name: 'Invoice INV-0001' }).waitFor();
      await page.getByTestId('payments').getByText('Cheque 2218').waitFor();
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download PDF' }).click()]);
      expect(download.suggestedFilename()).toBe('INV-0001.pdf');
      const pdf = await readFile((await download.path())!);
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      for (const control of ['Record payment', 'Send by e-mail', 'Correct', 'Issue invoice']) {
        expect(await page.getByRole('button', { name: control }).count(), control).toBe(0);
      }
      await screenshot(page, 'invoice-paid-bookkeeper-desktop');

      // The pay link in an invoice e-mail opens the staff page for someone of the outfit.
      const invoicePath = new URL(page.url()).pathname;
      await page.goto(`${baseUrlOrThrow()}${invoicePath.replace('/invoices/', '/pay/')}`);
      await page.getByRole('heading', { name: 'Invoice INV-0001' }).waitFor();
      expect(new URL(page.url()).pathname).toBe(invoicePath);
    });
  });

  it('reads the invoice list and a rate sheet on a phone', async () => {
    await inFreshPage(browser, PHONE, 'billing-bookkeeper-phone', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/invoices`);
      await page.getByRole('link', { name: 'INV-0002', exact: true }).waitFor();
      await screenshot(page, 'invoices-bookkeeper-phone');
      await page.goto(`${baseUrlOrThrow()}/rates`);
      await page.getByRole('link', { name: 'Neighbour custom rates' }).click();
      await page.getByRole('heading', { name: 'Neighbour custom rates' }).waitFor();
      await page.getByText('Changing a sheet never changes an issued invoice', { exact: false }).first().waitFor();
      expect(await page.getByRole('link', { name: 'Edit' }).count()).toBe(0);
      await screenshot(page, 'rate-sheet-bookkeeper-phone');
    });
  });
});

describe('rate sheets', () => {
  it('lets the owner add an override sheet for one neighbour and shows it in the list', async () => {
    await inFreshPage(browser, DESKTOP, 'rate-sheet-owner', async ({ page }) => {
      const name = `Brandvold hay season ${Date.now()}`;
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/rates`);
      await page.getByRole('link', { name: 'New rate sheet' }).click();
      await page.getByLabel('Name', { exact: true }).fill(name);
      await pickOption(page, 'For one party only (optional)', `${NEIGHBOUR} (neighbour)`);
      // A far-off start keeps this sheet from pricing any other scenario's work; the day differs per run
      // because two live sheets for one party may not start on the same day.
      const start = new Date(Date.UTC(2090, 0, 1) + (Date.now() % 3650) * 86_400_000).toISOString().slice(0, 10);
      await page.getByLabel('In force from', { exact: true }).fill(start);
      await pickOption(page, 'Work type, rate 1', 'Mowing (rotary)');
      expect(await page.getByRole('textbox', { name: 'Unit, rate 1' }).inputValue()).toBe('acre');
      await page.getByLabel('Rate, rate 1', { exact: true }).fill('17.257');
      await page.getByRole('button', { name: 'Add a rate' }).click();
      await pickOption(page, 'Work type, rate 2', 'Mowing (rotary)');
      await page.getByLabel('Rate, rate 2', { exact: true }).fill('abc');
      await page.getByRole('button', { name: 'Add rate sheet' }).click();
      await page.getByText('Enter a plain decimal number, for example 1234.50').waitFor();
      await page.getByLabel('Rate, rate 2', { exact: true }).fill('16');
      await page.getByRole('button', { name: 'Add rate sheet' }).click();
      await page.getByText('This work type already has a rate in this unit and charge type.').waitFor();
      await screenshot(page, 'rate-sheet-invalid-owner-desktop');

      await page.getByRole('button', { name: 'Remove rate 2' }).click();
      await page.getByText('Rental', { exact: true }).first().click();
      await page.getByLabel('Minimum charge', { exact: true }).fill('60');
      await page.getByRole('button', { name: 'Add rate sheet' }).click();
      await page.getByRole('heading', { name }).waitFor();
      await page.getByText(`for ${NEIGHBOUR} only`, { exact: false }).waitFor();
      await page.getByText('$17.257/acre').waitFor();
      await page.getByRole('cell', { name: 'Rental', exact: true }).waitFor();
      await screenshot(page, 'rate-sheet-owner-desktop');

      await page.getByTestId('main-nav').getByText('Rates', { exact: true }).click();
      await page.getByRole('link', { name }).waitFor();
      await screenshot(page, 'rate-sheets-owner-desktop');
    });
  });
});
