import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiCall, apiToken, baseUrlOrThrow, DEMO_SIGN_INS, launchBrowser, PHONE, screenshot, signInAndWait, todayIso } from './browser.js';

let browser: Browser;
// Notes carry this run's mark, so the checks through the API count only what these tests logged.
const run = `run ${Date.now().toString(36)}`;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

interface StoredEntry {
  id: string;
  clientId: string | null;
  notes: string | null;
  meterStart: string | null;
  meterEnd: string | null;
}

/** Today's entries as the office sees them, with the notes given; the owner sees every operator's. */
async function storedEntriesNoted(notes: string[]): Promise<StoredEntry[]> {
  const token = await apiToken(DEMO_SIGN_INS.owner);
  const page = await apiCall<{ items: StoredEntry[] }>(token, 'GET', `/api/work-entries?dateFrom=${todayIso()}&dateTo=${todayIso()}&pageSize=200`);
  return page.items.filter((e) => e.notes !== null && notes.includes(e.notes));
}

/** The cab form's native picker: choose the option whose label starts with `label`. */
async function pick(select: Locator, label: string) {
  await select.waitFor();
  const labels = await select.locator('option').allTextContents();
  const match = labels.find((text) => text.startsWith(label));
  if (match === undefined) throw new Error(`no option starting with "${label}" among ${labels.join(' | ')}`);
  await select.selectOption({ label: match });
}

/** A phone with the service worker installed and in control, as after the first visit. */
async function phoneWithServiceWorker(options: { serviceWorkers?: 'allow' | 'block' } = {}): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport: PHONE, deviceScaleFactor: 1, serviceWorkers: options.serviceWorkers ?? 'allow' });
  const page = await context.newPage();
  return { context, page };
}

async function signInAndOpenLog(page: Page, email: string, waitForWorker = true) {
  await signInAndWait(page, email);
  if (waitForWorker) await page.waitForFunction(() => navigator.serviceWorker?.controller != null, null, { timeout: 30_000 });
  await page.goto(`${baseUrlOrThrow()}/work/log`);
  await page.getByTestId('entry-field').waitFor();
}

/** One pass logged by hours, the way an operator fills the cab form. */
async function logByHours(page: Page, hours: string, notes: string) {
  await pick(page.getByTestId('entry-field'), 'Home West');
  await pick(page.getByTestId('entry-work-type'), 'Grain cart');
  await page.getByText('Hours', { exact: true }).click();
  await page.getByLabel('Machine hours').fill(hours);
  await page.getByLabel('Notes').fill(notes);
  await page.getByRole('button', { name: 'Submit for approval' }).click();
}

async function nextPass(page: Page) {
  await page.getByRole('button', { name: 'Log the next pass' }).click();
  await page.getByTestId('entry-field').waitFor();
}

/**
 * Cuts the signal and waits until the page knows it. On a busy machine the page still saw itself online for a
 * moment after the switch, and a pass saved in that moment went out: the server stored it, its answer was lost,
 * and the phone kept it to resend under the same clientId. The product handles that; these scenarios count what
 * reached the server while the phone had no signal, so they start once it has none.
 */
async function goOffline(context: BrowserContext, page: Page) {
  await context.setOffline(true);
  await page.waitForFunction(() => !navigator.onLine);
}

const queuedCount = (page: Page) => page.getByTestId('queued-entry').count();

async function inContext(context: BrowserContext, page: Page, failureName: string, scenario: () => Promise<void>) {
  try {
    await scenario();
  } catch (error) {
    await screenshot(page, `FAILED-${failureName}`).catch(() => undefined);
    throw error;
  } finally {
    await context.close();
  }
}

describe('logging work without signal', () => {
  it('keeps three entries on the phone, opens again after a reload without signal, and sends each once', { timeout: 180_000 }, async () => {
    const { context, page } = await phoneWithServiceWorker();
    const notes = [1, 2, 3].map((n) => `No-signal pass ${n}, ${run}`);
    await inContext(context, page, 'offline-three-entries', async () => {
      await signInAndOpenLog(page, DEMO_SIGN_INS.operator);
      await goOffline(context, page);

      for (const [index, note] of notes.entries()) {
        await logByHours(page, `${index + 1}.5`, note);
        await page.getByTestId('entry-queued').getByText(`Saved on this phone — ${index + 1} waiting`).waitFor();
        if (index < notes.length - 1) await nextPass(page);
      }
      expect(await queuedCount(page)).toBe(3);
      await screenshot(page, 'offline-three-waiting-operator-phone');

      // The service worker serves the app and the form's data; the person is still known.
      await page.reload();
      await page.getByTestId('entry-field').waitFor();
      await page.getByTestId('queue-waiting').getByText('Saved on this phone — 3 waiting').waitFor();
      expect(await queuedCount(page)).toBe(3);
      await pick(page.getByTestId('entry-field'), 'Home West');
      await screenshot(page, 'offline-after-reload-operator-phone');
      expect(await storedEntriesNoted(notes)).toEqual([]);

      await context.setOffline(false);
      await expect.poll(() => queuedCount(page), { timeout: 30_000 }).toBe(0);
      const stored = await storedEntriesNoted(notes);
      expect(stored.map((e) => e.notes).sort()).toEqual([...notes].sort());
      expect(new Set(stored.map((e) => e.clientId)).size).toBe(3);
      expect(await page.getByTestId('queue-status').count()).toBe(0);
    });
  });

  it('a resend after a lost answer makes no second entry', { timeout: 120_000 }, async () => {
    // The lost answer is staged in the page's own requests, so the service worker stays out of it.
    const { context, page } = await phoneWithServiceWorker({ serviceWorkers: 'block' });
    const note = `Lost answer pass, ${run}`;
    await inContext(context, page, 'offline-lost-answer', async () => {
      await signInAndOpenLog(page, DEMO_SIGN_INS.operator, false);
      const reached: string[] = [];
      await page.route('**/api/work-entries', async (route) => {
        if (route.request().method() !== 'POST') return route.fallback();
        // The server stores the entry; its answer never reaches the phone.
        const answer = await route.fetch();
        reached.push(`${answer.status()}`);
        await route.abort('connectionreset');
      });
      await logByHours(page, '2', note);
      await page.getByTestId('entry-queued').getByText('Saved on this phone — 1 waiting').waitFor();
      expect(reached).toEqual(['201']);
      expect(await storedEntriesNoted([note])).toHaveLength(1);

      await page.unroute('**/api/work-entries');
      const resent = page.waitForResponse((r) => r.url().endsWith('/api/work-entries') && r.request().method() === 'POST');
      await page.getByRole('button', { name: 'Send now' }).click();
      // The server knows the clientId and answers with the entry it already has.
      expect((await resent).status()).toBe(200);
      await expect.poll(() => queuedCount(page)).toBe(0);
      expect(await storedEntriesNoted([note])).toHaveLength(1);
    });
  });

  it('keeps an entry the server refuses with its reason, and sends it once fixed', { timeout: 180_000 }, async () => {
    const { context, page } = await phoneWithServiceWorker();
    const note = `Meter conflict pass, ${run}`;
    await inContext(context, page, 'offline-meter-conflict', async () => {
      await signInAndOpenLog(page, DEMO_SIGN_INS.operator);
      await pick(page.getByTestId('entry-field'), 'Home West');
      await pick(page.getByTestId('entry-work-type'), 'Grain cart');
      await pick(page.getByTestId('entry-power-unit'), 'Tavin’s 65');
      const meterStart = page.getByLabel('Meter start');
      await expect.poll(() => meterStart.inputValue()).toMatch(/^\d+(\.\d+)?$/);
      const start = Number(await meterStart.inputValue());

      await goOffline(context, page);
      await page.getByLabel('Meter end').fill((start + 2).toFixed(1));
      await page.getByLabel('Notes').fill(note);
      await page.getByRole('button', { name: 'Submit for approval' }).click();
      await page.getByTestId('entry-queued').waitFor();

      // Meanwhile someone at the office logs a longer pass on the same tractor.
      const owner = await apiToken(DEMO_SIGN_INS.owner);
      const machines = await apiCall<{ items: { id: string; name: string }[] }>(owner, 'GET', '/api/machines?pageSize=200');
      const fields = await apiCall<{ items: { id: string; name: string }[] }>(owner, 'GET', '/api/fields?pageSize=200');
      const workTypes = await apiCall<{ items: { id: string; name: string }[] }>(owner, 'GET', '/api/work-types?pageSize=100');
      const parties = await apiCall<{ items: { id: string }[] }>(owner, 'GET', '/api/parties?pageSize=200');
      await apiCall(owner, 'POST', '/api/work-entries', {
        workDate: todayIso(),
        fieldId: fields.items.find((f) => f.name.startsWith('Home West'))!.id,
        workTypeId: workTypes.items.find((w) => w.name.startsWith('Grain cart'))!.id,
        powerMachineId: machines.items.find((m) => m.name === 'Tavin’s 65')!.id,
        meterStart: start.toFixed(1),
        meterEnd: (start + 5).toFixed(1),
        billToPartyId: parties.items[0]!.id,
        notes: `Office pass, ${run}`,
        state: 'draft',
      });

      await context.setOffline(false);
      const refused = page.getByTestId('queued-entry').filter({ hasText: 'Not accepted' });
      await refused.waitFor({ timeout: 30_000 });
      const reason = await refused.getByTestId('queued-reason').textContent();
      expect(reason).toBeTruthy();
      expect(await page.getByTestId('queue-refused').textContent()).toContain('not accepted by the server');
      expect(await storedEntriesNoted([note])).toEqual([]);
      await screenshot(page, 'offline-refused-operator-phone');

      // Fixed on the phone: read off the meter again, after the office's pass.
      await refused.getByRole('button', { name: 'Fix' }).click();
      const form = page.getByTestId('queued-entry-form');
      await form.getByLabel('Meter start').fill((start + 5).toFixed(1));
      await form.getByLabel('Meter end').fill((start + 7).toFixed(1));
      await form.getByRole('button', { name: 'Keep the fix and send' }).click();
      await expect.poll(() => queuedCount(page), { timeout: 30_000 }).toBe(0);
      const [stored] = await storedEntriesNoted([note]);
      expect(stored).toMatchObject({ meterStart: `${(start + 5).toFixed(1)}`, meterEnd: `${(start + 7).toFixed(1)}` });
    });
  });

  it('keeps the queue through an expired sign-in for the same person only', { timeout: 180_000 }, async () => {
    const { context, page } = await phoneWithServiceWorker();
    const note = `Expired sign-in pass, ${run}`;
    await inContext(context, page, 'offline-expired-sign-in', async () => {
      await signInAndOpenLog(page, DEMO_SIGN_INS.operator);
      await goOffline(context, page);
      await logByHours(page, '1.25', note);
      await page.getByTestId('entry-queued').waitFor();

      // The sign-in runs out while the phone has no signal.
      await context.clearCookies();
      await page.reload();
      await page.getByTestId('queue-waiting').getByText('Saved on this phone — 1 waiting').waitFor();
      await context.setOffline(false);
      await page.getByLabel('E-mail').waitFor({ timeout: 30_000 });
      expect(await storedEntriesNoted([note])).toEqual([]);

      // Someone else on the same phone sees nothing of it.
      await signInAndOpenLog(page, DEMO_SIGN_INS.partner);
      expect(await page.getByTestId('phone-queue').count()).toBe(0);
      expect(await page.getByTestId('queue-status').count()).toBe(0);
      expect(await page.getByText(note).count()).toBe(0);
      await screenshot(page, 'offline-other-person-phone');
      // The cab page signs out from its own foot, without the office app's user menu.
      await page.getByTestId('cab-sign-out').click();
      await page.getByLabel('E-mail').waitFor();
      expect(await storedEntriesNoted([note])).toEqual([]);

      // The same person signs in again and the entry goes, once.
      await signInAndWait(page, DEMO_SIGN_INS.operator);
      await expect.poll(async () => (await storedEntriesNoted([note])).length, { timeout: 30_000 }).toBe(1);
      await page.goto(`${baseUrlOrThrow()}/work/log`);
      await page.getByTestId('entry-field').waitFor();
      expect(await queuedCount(page)).toBe(0);
    });
  });
});
