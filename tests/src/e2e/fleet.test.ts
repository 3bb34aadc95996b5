import { readFileSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fieldPhotoPng } from './photo.js';
import { baseUrlOrThrow, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, PHONE, screenshot, signInAndWait } from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** Opens a machine from the fleet list by its name, as a person would. */
async function openMachine(page: Page, name: string) {
  await page.goto(`${baseUrlOrThrow()}/machines`);
  await page.getByRole('link', { name, exact: true }).click();
  await page.getByRole('heading', { name, level: 1 }).waitFor();
}

describe('machines', () => {
  it('shows the owner a shared machine’s owners, their history and the meter chart', async () => {
    await inFreshPage(browser, DESKTOP, 'machine-owner', async ({ page, foreignRequests }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await openMachine(page, 'Harlan 5105');
      // The demo's one change of shares: the grandparents alone, then two thirds and one third.
      const owners = page.getByTestId('current-owners');
      await owners.waitFor();
      expect(await owners.textContent()).toContain('Arvid & Nell Quillback66.6667 %');
      expect(await owners.textContent()).toContain('Jonah & Ilse Quillback33.3333 %');
      const history = page.getByTestId('owners-panel').locator('.mantine-Timeline-item');
      expect(await history.count()).toBe(2);
      expect(await history.last().textContent()).toContain('Arvid & Nell Quillback 100 %');

      await page.getByTestId('meter-chart').locator('.recharts-line').first().waitFor();
      expect(await page.getByTestId('meter-readings').locator('tbody tr').count()).toBeGreaterThan(0);
      await page.getByTestId('estimated-rate').waitFor();
      expect(await page.getByTestId('estimate-notice').isVisible()).toBe(true);
      expect(await page.getByTestId('cost-totals').textContent()).toMatch(/\$[\d,]+\.\d\d/);
      await screenshot(page, 'machine-owner-desktop');
      expect(foreignRequests).toEqual([]);
    });
  });

  it('adds up the shares live while they are typed and refuses a set that is not 100 %', async () => {
    await inFreshPage(browser, PHONE, 'shares-form', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await openMachine(page, 'Harlan 5105');
      await page.getByRole('button', { name: 'Change shares' }).click();
      const dialog = page.getByRole('dialog');
      await expect.poll(() => dialog.getByTestId('shares-total').textContent()).toBe('Total 100 %');
      await dialog.getByLabel('Share of household 1').fill('60');
      await expect.poll(() => dialog.getByTestId('shares-total').textContent()).toBe('Total 93.3333 % · 6.6667 % to give');
      await dialog.getByRole('button', { name: 'Save shares' }).click();
      await dialog.getByTestId('shares-error').waitFor();
      expect(await dialog.getByTestId('shares-error').textContent()).toContain('Shares must add up to exactly 100 %');
      await screenshot(page, 'shares-form-owner-phone');
      await dialog.getByRole('button', { name: 'Cancel' }).click();
    });
  });

  it('shows an operator the machine, its owners and meter, and no money at all', async () => {
    await inFreshPage(browser, PHONE, 'machine-operator', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await openMachine(page, 'Harlan 5105');
      await page.getByTestId('current-owners').waitFor();
      await page.getByTestId('meter-chart').locator('.recharts-line').first().waitFor();
      await page.getByTestId('machine-entries').locator('tbody tr').first().waitFor();
      expect(await page.getByTestId('rate-panel').count()).toBe(0);
      expect(await page.getByTestId('costs-panel').count()).toBe(0);
      expect(await page.getByText('Purchase price').count()).toBe(0);
      expect(await page.locator('main').textContent()).not.toContain('$');
      // Operators look at machines; they do not change shares or edit them.
      expect(await page.getByRole('button', { name: 'Change shares' }).count()).toBe(0);
      expect(await page.getByRole('link', { name: 'Edit' }).count()).toBe(0);
      await screenshot(page, 'machine-operator-phone');
    });
  });

  it('lets the owner put a photo on a machine, refusing what is not JPEG or PNG, and shows it to the operator', async () => {
    await inFreshPage(browser, DESKTOP, 'machine-photo-owner', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await openMachine(page, '1000-bu grain cart');
      const panel = page.getByTestId('machine-photo');
      const input = panel.locator('input[type=file]');
      await input.setInputFiles({ name: 'notes.txt', mimeType: 'text/plain', buffer: Buffer.from('not a photo') });
      expect(await panel.getByRole('alert').textContent()).toBe('Only a JPEG or PNG photo can be used.');
      await input.setInputFiles({ name: 'grain-cart.png', mimeType: 'image/png', buffer: fieldPhotoPng(480, 320) });
      const photo = panel.getByRole('img', { name: 'Photo of 1000-bu grain cart' });
      await photo.waitFor();
      // The bytes came through the session-authenticated fetch, not a bare address to the upload.
      expect(await photo.getAttribute('src')).toMatch(/^blob:/);
      await page.waitForFunction(() => (document.querySelector('[data-testid="machine-photo"] img') as HTMLImageElement | null)?.naturalWidth === 480);
      await screenshot(page, 'machine-photo-owner-desktop');
    });
    await inFreshPage(browser, PHONE, 'machine-photo-operator', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await openMachine(page, '1000-bu grain cart');
      const panel = page.getByTestId('machine-photo');
      await panel.getByRole('img', { name: 'Photo of 1000-bu grain cart' }).waitFor();
      expect(await panel.locator('input[type=file]').count()).toBe(0);
    });
  });

  it('keeps the fleet filters in the address', async () => {
    await inFreshPage(browser, DESKTOP, 'machines-filter', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/machines`);
      await page.getByRole('link', { name: 'Orwin 7R', exact: true }).waitFor();
      await page.getByRole('textbox', { name: 'Kind' }).click();
      await page.getByRole('option', { name: 'Implement' }).click();
      await expect.poll(() => new URL(page.url()).searchParams.get('kind')).toBe('implement');
      await page.getByRole('link', { name: 'Orwin 7R', exact: true }).waitFor({ state: 'detached' });
      expect(await page.getByRole('link', { name: '24-ft tandem disk', exact: true }).isVisible()).toBe(true);
      await screenshot(page, 'machines-implements-partner-desktop');
    });
  });
});

describe('fields', () => {
  it('adds a road stretch with its strip acres worked out as it is typed, then archives it', async () => {
    await inFreshPage(browser, DESKTOP, 'road-stretch', async ({ page }) => {
      const name = `Quarry Lane ditches ${Date.now()}`;
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/fields`);
      // The add links appear once the signed-in role is known and the list has loaded; wait for both.
      await page.locator('tbody tr').first().waitFor();
      const addStretch = page.getByRole('link', { name: 'Add road stretch' });
      await addStretch.waitFor({ state: 'visible' });
      await addStretch.click();
      await page.waitForURL(/\/fields\/new\?kind=roadside$/);
      await page.getByRole('heading', { name: 'Add a road stretch' }).waitFor();
      // Required fields carry their asterisk in the label.
      await page.getByLabel(/^Name/).fill(name);
      await page.getByLabel(/^Road \*/).fill('Quarry Lane');
      await page.getByLabel('From', { exact: true }).fill('County Road 9');
      await page.getByLabel(/^Length/).fill('1.75');
      await page.getByLabel(/^Mowing width/).fill('12');
      // 1.75 mi × 12 ft ÷ 8.25 = 2.545… acres.
      await expect.poll(() => page.getByTestId('strip-acres').textContent()).toBe('2.55 acres (length × width)');
      await screenshot(page, 'road-stretch-form-owner-desktop');
      await page.getByRole('button', { name: 'Add road stretch' }).click();
      await page.waitForURL((url) => url.pathname === '/fields');

      const search = page.getByLabel('Search by name or road');
      await search.waitFor({ state: 'visible' });
      await search.fill(name);
      const row = page.getByRole('row', { name: new RegExp(name) });
      await row.waitFor();
      expect(await row.textContent()).toContain('2.55');
      await screenshot(page, 'fields-road-stretch-owner-desktop');
      await row.getByRole('button', { name: `Archive ${name}` }).click();
      await page.getByRole('dialog').getByRole('button', { name: 'Archive' }).click();
      await row.waitFor({ state: 'detached' });
    });
  });

  it('exports the road stretches the table shows as CSV', async () => {
    await inFreshPage(browser, DESKTOP, 'fields-export', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/fields?kind=roadside`);
      const button = page.getByRole('button', { name: 'Export CSV of these fields' });
      const [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
      expect(download.suggestedFilename()).toMatch(/^fields-\d{4}-\d{2}-\d{2}\.csv$/);
      const text = readFileSync((await download.path())!, 'utf8').replace(/^\uFEFF/, '');
      const [header, ...rows] = text.trim().split(/\r?\n/);
      expect(header).toBe('name,kind,acres,boundary acres,owner,farm,road,from,to,length miles,width ft,archived,notes');
      expect(rows.length).toBe(await page.locator('tbody tr').count());
      expect(rows.length).toBeGreaterThan(0);
      for (const row of rows) expect(row.split(',')[1]).toBe('roadside');
    });
  });

  it('shows the operator the fields without add, edit or archive controls', async () => {
    await inFreshPage(browser, PHONE, 'fields-operator', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await page.goto(`${baseUrlOrThrow()}/fields`);
      await page.getByText('Home West', { exact: true }).waitFor();
      expect(await page.getByRole('link', { name: 'Add field' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: /^Archive / }).count()).toBe(0);
      await screenshot(page, 'fields-operator-phone');
    });
  });
});
