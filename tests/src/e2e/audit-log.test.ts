import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrlOrThrow, DEMO_PASSWORD, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, PHONE, screenshot, signInAndWait } from './browser.js';

let browser: Browser;
let noteText: string;
let restore: () => Promise<unknown>;

async function apiAs(email: string): Promise<(method: string, path: string, body?: object) => Promise<{ status: number; body: any }>> {
  const login = await fetch(`${baseUrlOrThrow()}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  const { accessToken } = (await login.json()) as { accessToken: string };
  return async (method, path, body) => {
    const res = await fetch(`${baseUrlOrThrow()}${path}`, { method, headers: { authorization: `Bearer ${accessToken}`, 'content-type': 'application/json' }, body: body ? JSON.stringify(body) : undefined });
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  };
}

beforeAll(async () => {
  browser = await launchBrowser();
  // A change made now, so the log has a row this run can look for whatever ran before it.
  const owner = await apiAs(DEMO_SIGN_INS.owner);
  const machines = await owner('GET', '/api/machines?pageSize=1');
  const machine = machines.body.items[0] as { id: string; notes: string | null };
  noteText = `Hitch pins greased ${Date.now()}`;
  const changed = await owner('PATCH', `/api/machines/${machine.id}`, { notes: noteText });
  expect(changed.status).toBe(200);
  const parties = await owner('GET', '/api/parties?kind=customer&pageSize=1');
  const party = parties.body.items[0] as { id: string; notes: string | null };
  expect((await owner('PATCH', `/api/parties/${party.id}`, { notes: `Gate code changed ${Date.now()}` })).status).toBe(200);
  // The other browser tests find the machine and the customer as the demo left them.
  restore = () => Promise.all([owner('PATCH', `/api/machines/${machine.id}`, { notes: machine.notes }), owner('PATCH', `/api/parties/${party.id}`, { notes: party.notes })]);
});

afterAll(async () => {
  await restore?.();
  await browser?.close();
});

describe('audit log', () => {
  it('shows the owner who changed what, newest first, and filters by kind of record', async () => {
    await inFreshPage(browser, DESKTOP, 'audit-owner', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.getByTestId('main-nav').getByText('Audit log', { exact: true }).click();
      await page.getByRole('heading', { name: 'Audit log' }).waitFor();
      await page.getByText(noteText).first().waitFor();
      // Newest first: the customer was changed after the machine.
      const actions = await page.getByText(/^(Machine updated|Household or customer updated)$/).allTextContents();
      expect(actions.slice(0, 2)).toEqual(['Household or customer updated', 'Machine updated']);
      await screenshot(page, 'audit-log-owner-desktop');

      await page.getByRole('textbox', { name: 'Kind of record' }).click();
      await page.getByRole('option', { name: 'Machine', exact: true }).click();
      await expect.poll(() => new URL(page.url()).searchParams.get('entityType')).toBe('machine');
      await expect.poll(() => page.getByText('Household or customer updated').count()).toBe(0);
      await page.getByText(noteText).first().waitFor();
      await screenshot(page, 'audit-log-machines-desktop');
    });
  });

  it('lets the bookkeeper read it on a phone, and keeps it from the partner', async () => {
    await inFreshPage(browser, PHONE, 'audit-bookkeeper', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/audit`);
      await page.getByText(noteText).first().waitFor();
      await screenshot(page, 'audit-log-bookkeeper-phone');
    });
    const partner = await apiAs(DEMO_SIGN_INS.partner);
    expect((await partner('GET', '/api/audit')).status).toBe(403);
  });
});
