import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fieldPhotoPng } from './photo.js';
import { apiCall, apiToken, baseUrlOrThrow, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, PHONE, screenshot, signInAndWait, todayIso } from './browser.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

/** The cab form's native picker: choose the option whose label starts with `label`. */
async function pick(select: Locator, label: string) {
  await select.waitFor();
  const labels = await select.locator('option').allTextContents();
  const match = labels.find((text) => text.startsWith(label));
  if (match === undefined) throw new Error(`no option starting with "${label}" among ${labels.join(' | ')}`);
  await select.selectOption({ label: match });
}

/** The label of the option a native picker shows. */
function pickedLabel(select: Locator): Promise<string> {
  return select.evaluate((element) => {
    const picker = element as HTMLSelectElement;
    return picker.options[picker.selectedIndex]?.text ?? '';
  });
}

interface Named {
  id: string;
  name: string;
}

function entryRow(page: Page, entryId: string): Locator {
  return page.locator('tr', { has: page.locator(`[data-entry-id="${entryId}"]`) });
}

describe('logging work from the cab', () => {
  it('logs a roadside mowing pass on a phone as the operator, and the partner approves it', async () => {
    let entry: { id: string; fieldId: string; workDate: string } | null = null;

    await inFreshPage(browser, PHONE, 'cab-entry-operator', async ({ page, foreignRequests }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await page.goto(`${baseUrlOrThrow()}/work/log`);
      const field = page.getByTestId('entry-field');
      await field.waitFor();
      expect(await page.getByLabel('Day of the work').inputValue()).toBe(todayIso());
      expect(await page.getByLabel('Operator').inputValue()).toBe('Rudy Calloway');

      await pick(field, 'Saltlick Lane ditches');
      await pick(page.getByTestId('entry-work-type'), 'Roadside mowing');
      const roadside = page.getByTestId('caution-roadside');
      await roadside.waitFor();
      expect(await roadside.textContent()).toContain('Working beside traffic');
      expect(await roadside.textContent()).toContain('local traffic, work-zone and equipment codes, the road authority and licensed practice come first');
      await screenshot(page, 'cab-entry-caution-operator-phone');

      await pick(page.getByTestId('entry-power-unit'), 'Tavin’s 65');
      await pick(page.getByTestId('entry-implement'), '7-ft roadside cutter');
      // The meter start comes from the tractor's last reading; the hours follow live from the end.
      const meterStart = page.getByLabel('Meter start');
      await expect.poll(() => meterStart.inputValue()).toMatch(/^\d+(\.\d)?$/);
      const start = Number(await meterStart.inputValue());
      await page.getByLabel('Meter end').fill((start + 2.5).toFixed(1));
      await expect.poll(() => page.getByTestId('hours-readout').textContent()).toBe('2.5 h');
      // Acres come from the road stretch and can be changed for a partial pass.
      expect(await page.getByLabel('Acres').inputValue()).toMatch(/^\d+(\.\d+)?$/);
      await page.getByLabel('Fuel added').fill('6.5');

      // A photo from the phone's camera: the input opens the camera on a phone.
      const photoInput = page.getByTestId('entry-photo-input');
      expect(await photoInput.getAttribute('accept')).toBe('image/*');
      expect(await photoInput.getAttribute('capture')).toBe('environment');
      await photoInput.setInputFiles({ name: 'ditch-north.png', mimeType: 'image/png', buffer: fieldPhotoPng() });
      await page.getByTestId('photo-thumb').locator('img').waitFor();
      await page.getByRole('button', { name: 'Remove ditch-north.png' }).waitFor();
      await screenshot(page, 'cab-entry-photo-operator-phone');

      // Glove-sized: the pickers and the send button are at least 48 px tall.
      expect((await field.boundingBox())!.height).toBeGreaterThanOrEqual(48);
      const submit = page.getByRole('button', { name: 'Submit for approval' });
      expect((await submit.boundingBox())!.height).toBeGreaterThanOrEqual(48);
      await screenshot(page, 'cab-entry-filled-operator-phone');

      const saved = page.waitForResponse((r) => r.url().endsWith('/api/work-entries') && r.request().method() === 'POST');
      const photoSent = page.waitForResponse((r) => /\/api\/work-entries\/[^/]+\/photos$/.test(r.url()) && r.request().method() === 'POST');
      await submit.click();
      const response = await saved;
      expect(response.status()).toBe(201);
      const body = (await response.json()) as { id: string; fieldId: string; workDate: string; state: string; clientId: string; hours: string };
      expect(body.state).toBe('submitted');
      expect(body.hours).toBe('2.50');
      expect(body.clientId).toMatch(/^[0-9a-f-]{36}$/);
      entry = body;
      // The photo follows its entry.
      const photo = await photoSent;
      expect(photo.status()).toBe(201);
      expect(photo.url()).toContain(`/api/work-entries/${body.id}/photos`);
      await page.getByTestId('entry-saved').getByText('Submitted for approval').waitFor();
      await screenshot(page, 'cab-entry-saved-operator-phone');

      // The next pass offers the same rig first.
      await page.getByRole('button', { name: 'Log the next pass' }).click();
      await expect.poll(() => pickedLabel(page.getByTestId('entry-power-unit'))).toBe('Tavin’s 65');
      expect(await pickedLabel(page.getByTestId('entry-implement'))).toBe('7-ft roadside cutter');
      expect(foreignRequests).toEqual([]);
    });

    await inFreshPage(browser, DESKTOP, 'cab-entry-partner', async ({ page }) => {
      const { id, fieldId, workDate } = entry!;
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/work?fieldId=${fieldId}&dateFrom=${workDate}&dateTo=${workDate}`);
      const row = entryRow(page, id);
      await row.waitFor();
      expect(await row.getByTestId('entry-state').textContent()).toBe('Submitted');
      await screenshot(page, 'work-entries-before-approval-partner-desktop');

      // The partner looks at the operator's photo before approving.
      await row.getByRole('link', { name: /^Change the entry of / }).click();
      const thumb = page.getByTestId('entry-photos').getByRole('img', { name: 'ditch-north.png' });
      await thumb.waitFor();
      await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(240);
      await screenshot(page, 'work-entry-photo-partner-desktop');
      await page.goBack();
      await row.waitFor();
      await row.getByRole('button', { name: /^Approve the entry of / }).click();
      await expect.poll(() => row.getByTestId('entry-state').textContent()).toBe('Approved');
      // Approved entries are reopened, not approved again.
      expect(await row.getByRole('button', { name: /^Reopen the entry of / }).count()).toBe(1);
      await screenshot(page, 'work-entries-approved-partner-desktop');
    });
  });

  it('saves a very long day but shows the server’s warning after saving, not an error', async () => {
    await inFreshPage(browser, PHONE, 'long-entry', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/work/log`);
      await pick(page.getByTestId('entry-field'), 'Home West');
      await pick(page.getByTestId('entry-work-type'), 'Grain cart');
      await page.getByText('Hours', { exact: true }).click();
      await page.getByLabel('Machine hours').fill('17');
      await page.getByText('That is a long day.', { exact: false }).waitFor();
      await page.getByRole('button', { name: 'Save as draft' }).click();
      await page.getByTestId('entry-saved').getByText('Saved as a draft').waitFor();
      expect(await page.getByTestId('entry-warnings').textContent()).toContain('more than 16 h');
      await screenshot(page, 'cab-entry-warning-owner-phone');
    });
  });

  it('logs from inside the office app, checks a figure before sending, and changes the draft afterwards', async () => {
    await inFreshPage(browser, DESKTOP, 'office-log-and-edit', async ({ page }) => {
      const note = `Office pass ${crypto.randomUUID()}`;
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/work`);
      // From the entries list the cab form opens inside the office frame, its navigation and user menu kept.
      await page.getByRole('link', { name: 'Log work' }).click();
      await page.getByTestId('entry-field').waitFor();
      expect(await page.getByTestId('user-menu').count()).toBe(1);
      await pick(page.getByTestId('entry-field'), 'Home West');
      await pick(page.getByTestId('entry-work-type'), 'Grain cart');
      await page.getByRole('button', { name: 'Hours', exact: true }).click();
      expect(await page.getByRole('button', { name: 'Hours', exact: true }).getAttribute('aria-pressed')).toBe('true');
      const hours = page.getByLabel('Machine hours');
      await hours.fill('two and a half');
      await page.getByLabel('Notes').fill(note);
      const posts: string[] = [];
      page.on('request', (r) => {
        if (r.url().endsWith('/api/work-entries') && r.method() === 'POST') posts.push(r.url());
      });
      await page.getByRole('button', { name: 'Save as draft' }).click();
      // The shared schema refuses the figure on the form itself; nothing is sent and nothing typed is lost.
      await expect.poll(() => hours.getAttribute('aria-invalid')).toBe('true');
      expect(posts).toEqual([]);
      expect(await page.getByLabel('Notes').inputValue()).toBe(note);
      await screenshot(page, 'office-log-refused-figure-owner-desktop');

      await hours.fill('2.5');
      const saved = page.waitForResponse((r) => r.url().endsWith('/api/work-entries') && r.request().method() === 'POST');
      await page.getByRole('button', { name: 'Save as draft' }).click();
      const created = (await (await saved).json()) as { id: string; hours: string; state: string };
      expect(created).toMatchObject({ hours: '2.50', state: 'draft' });
      await page.getByTestId('entry-saved').getByText('Saved as a draft').waitFor();

      // The edit page uses the same fields and checks, and keeps what it does not change.
      await page.goto(`${baseUrlOrThrow()}/work/${created.id}/edit`);
      const editHours = page.getByLabel('Machine hours');
      await expect.poll(() => editHours.inputValue()).toBe('2.50');
      expect(await page.getByLabel('Notes').inputValue()).toBe(note);
      await editHours.fill('3.25');
      const changed = page.waitForResponse((r) => r.url().endsWith(`/api/work-entries/${created.id}`) && r.request().method() === 'PATCH');
      await page.getByRole('button', { name: 'Save changes' }).click();
      expect((await changed).status()).toBe(200);
      await page.getByTestId('entry-saved').getByText('Saved as a draft').waitFor();
      const owner = await apiToken(DEMO_SIGN_INS.owner);
      const stored = await apiCall<{ hours: string; notes: string; state: string }>(owner, 'GET', `/api/work-entries/${created.id}`);
      expect(stored).toMatchObject({ hours: '3.25', notes: note, state: 'draft' });
      await screenshot(page, 'office-edit-saved-owner-desktop');
    });
  });

  it('lets the partner approve several submitted entries at once', async () => {
    const operator = await apiToken(DEMO_SIGN_INS.operator);
    const fields = await apiCall<{ items: Named[] }>(operator, 'GET', '/api/fields?pageSize=200');
    const workTypes = await apiCall<{ items: (Named & { key: string })[] }>(operator, 'GET', '/api/work-types');
    const parties = await apiCall<{ items: Named[] }>(operator, 'GET', '/api/parties?pageSize=200');
    const field = fields.items.find((f) => f.name === 'Home West')!;
    const hauling = workTypes.items.find((t) => t.key === 'hauling')!;
    const billTo = parties.items.find((p) => p.name === 'Jonah & Ilse Quillback')!;
    const workDate = todayIso();
    const ids: string[] = [];
    for (const hours of ['1.25', '2.75']) {
      const created = await apiCall<{ id: string }>(operator, 'POST', '/api/work-entries', {
        clientId: crypto.randomUUID(),
        workDate,
        fieldId: field.id,
        workTypeId: hauling.id,
        billToPartyId: billTo.id,
        hours,
        loads: '3',
        state: 'submitted',
      });
      ids.push(created.id);
    }

    await inFreshPage(browser, DESKTOP, 'batch-approval', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.partner);
      await page.goto(`${baseUrlOrThrow()}/work?fieldId=${field.id}&workTypeId=${hauling.id}&dateFrom=${workDate}&dateTo=${workDate}&state=submitted`);
      for (const id of ids) await entryRow(page, id).getByRole('checkbox').check();
      await page.getByTestId('approval-bar').getByText('2 submitted entries selected').waitFor();
      await screenshot(page, 'batch-approval-partner-desktop');
      await page.getByRole('button', { name: 'Approve selected' }).click();
      await page.getByText('2 entries approved').waitFor();
    });

    const partner = await apiToken(DEMO_SIGN_INS.partner);
    for (const id of ids) expect((await apiCall<{ state: string }>(partner, 'GET', `/api/work-entries/${id}`)).state).toBe('approved');
  });

  it('keeps the filters in the address, with the totals of every matching entry', async () => {
    await inFreshPage(browser, DESKTOP, 'entries-filters', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/work`);
      await page.getByRole('link', { name: 'This week’s submitted entries' }).click();
      await expect.poll(() => new URL(page.url()).searchParams.get('state')).toBe('submitted');
      expect(new URL(page.url()).searchParams.get('dateFrom')).toMatch(/^\d{4}-\d{2}-\d{2}$/);
      await page.getByTestId('total-h').waitFor();
      expect(await page.getByTestId('total-h').textContent()).toMatch(/^[\d,]+\.\d h$/);
      await screenshot(page, 'work-entries-week-owner-desktop');
    });
  });

  it('shows the bookkeeper the entries to read, with no logging or approval controls', async () => {
    await inFreshPage(browser, DESKTOP, 'entries-bookkeeper', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.bookkeeper);
      await page.goto(`${baseUrlOrThrow()}/work`);
      await page.locator('[data-entry-id]').first().waitFor();
      expect(await page.getByRole('link', { name: 'Log work' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: /^Approve/ }).count()).toBe(0);
      expect(await page.getByRole('checkbox').count()).toBe(0);
      await screenshot(page, 'work-entries-bookkeeper-desktop');
    });
  });

  it('shows an operator on a phone only their own entries, as cards with their buttons', async () => {
    await inFreshPage(browser, PHONE, 'entries-operator', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await page.goto(`${baseUrlOrThrow()}/work`);
      await page.getByTestId('entry-card').first().waitFor();
      await page.getByRole('heading', { name: 'My work' }).waitFor();
      // The filters fold away on a phone; the import is not the operator's.
      expect(await page.getByRole('button', { name: 'Filters' }).isVisible()).toBe(true);
      expect(await page.getByRole('link', { name: 'Import CSV' }).count()).toBe(0);
      expect(await page.getByText('$').count()).toBe(0);
      await screenshot(page, 'work-entries-operator-phone');
    });
  });
});

describe('importing a spreadsheet', () => {
  it('names every row error, refuses to commit them, then imports a clean file once', async () => {
    await inFreshPage(browser, DESKTOP, 'import-fuel', async ({ page }) => {
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      await page.goto(`${baseUrlOrThrow()}/work/import`);
      await page.getByText('Fuel tickets', { exact: true }).click();
      const input = page.getByTestId('import-dropzone').locator('input[type=file]');
      const day = todayIso();
      // A fresh amount each run, so the file is new to the database.
      const amount = `${100 + (Date.now() % 800)}.25`;

      await input.setInputFiles({
        name: 'fuel-bad.csv',
        mimeType: 'text/csv',
        buffer: Buffer.from(`date,machine,gallons,amount\n${day},Orwin 7R,120.5,${amount}\nyesterday,No Such Tractor,40,90.00\n`),
      });
      const errors = page.getByTestId('import-errors');
      await errors.waitFor();
      const firstError = errors.locator('tbody tr').first();
      expect(await firstError.locator('td').first().textContent()).toBe('3');
      expect(await page.getByTestId('count-invalid').textContent()).toBe('1');
      expect(await page.getByRole('button', { name: /^Import \d+ row/ }).isDisabled()).toBe(true);
      await screenshot(page, 'import-errors-owner-desktop');

      const clean = Buffer.from(`date,machine,gallons,amount,vendor\n${day},Orwin 7R,120.5,${amount},Pike Hollow Co-op\n`);
      await input.setInputFiles({ name: 'fuel.csv', mimeType: 'text/csv', buffer: clean });
      await expect.poll(() => page.getByTestId('count-invalid').textContent()).toBe('0');
      await page.getByRole('button', { name: 'Import 1 row' }).click();
      await page.getByTestId('import-done').waitFor();
      expect(await page.getByTestId('count-created').textContent()).toBe('1');
      await screenshot(page, 'import-done-owner-desktop');

      // The same file again adds nothing twice.
      await input.setInputFiles({ name: 'fuel.csv', mimeType: 'text/csv', buffer: clean });
      await expect.poll(() => page.getByTestId('count-skipped').textContent()).toBe('1');
      expect(await page.getByRole('button', { name: /^Import 0 rows/ }).isDisabled()).toBe(true);
    });
  });
});
