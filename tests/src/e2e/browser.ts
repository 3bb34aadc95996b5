import { mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const DEMO_PASSWORD = 'hitchbook-demo';

export const DEMO_SIGN_INS = {
  owner: 'owner@hitchbook.test',
  partner: 'partner@hitchbook.test',
  operator: 'operator@hitchbook.test',
  bookkeeper: 'bookkeeper@hitchbook.test',
  customer: 'customer@hitchbook.test',
  customer2: 'customer2@hitchbook.test',
} as const;

export const DESKTOP = { width: 1280, height: 860 };
export const PHONE = { width: 390, height: 844 };

const outDir = fileURLToPath(new URL('../../out/', import.meta.url));

export function baseUrlOrThrow(): string {
  const url = process.env.E2E_BASE_URL;
  if (!url) throw new Error('E2E_BASE_URL is not set: run the browser tests with "npm test", which starts the app.');
  return url.replace(/\/$/, '');
}

/** Today's date on this machine, as the cab form prefills it (yyyy-mm-dd). */
export function todayIso(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

/** An access token for a demo sign-in, for setting up and checking through the API beside the browser. */
export async function apiToken(email: string, password = DEMO_PASSWORD): Promise<string> {
  const res = await fetch(`${baseUrlOrThrow()}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}

/** One API call with a token; anything but a 2xx fails the test with the server's answer. */
export async function apiCall<T>(token: string, method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<T> {
  const res = await fetch(`${baseUrlOrThrow()}${path}`, {
    method,
    headers: { Authorization: `Bearer ${token}`, ...(body === undefined ? {} : { 'Content-Type': 'application/json' }), ...headers },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${await res.text()}`);
  return (await res.json()) as T;
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export interface OpenedPage {
  context: BrowserContext;
  page: Page;
  /** Requests that left the app's own origin; the product loads nothing from elsewhere. */
  foreignRequests: string[];
}

export async function openPage(browser: Browser, viewport = DESKTOP): Promise<OpenedPage> {
  const context = await browser.newContext({ viewport, deviceScaleFactor: 1 });
  const page = await context.newPage();
  const origin = new URL(baseUrlOrThrow()).origin;
  const foreignRequests: string[] = [];
  page.on('request', (request) => {
    const url = request.url();
    if (!url.startsWith(origin) && !url.startsWith('data:') && !url.startsWith('blob:')) foreignRequests.push(url);
  });
  return { context, page, foreignRequests };
}

/**
 * Runs one scenario in a fresh browser context (no shared cookies between tests) and keeps a
 * screenshot of the screen as it was when the scenario failed.
 */
export async function inFreshPage(
  browser: Browser,
  viewport: { width: number; height: number },
  failureName: string,
  scenario: (opened: OpenedPage) => Promise<void>,
): Promise<void> {
  const opened = await openPage(browser, viewport);
  try {
    await scenario(opened);
  } catch (error) {
    await screenshot(opened.page, `FAILED-${failureName}`).catch(() => undefined);
    throw error;
  } finally {
    await opened.context.close();
  }
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${baseUrlOrThrow()}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

export async function signInAndWait(page: Page, email: string): Promise<void> {
  await signIn(page, email);
  await page.getByTestId('user-menu').waitFor();
}

/** Screens go to tests/out/ (git-ignored) so they can be looked at after a run. */
export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(outDir, { recursive: true });
  // Fixed header and navigation are drawn where the window is scrolled; from the top they sit in place.
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: `${outDir}${name}.png`, fullPage: true });
}

/** The labels of the main navigation, top level and sub-pages, in order. */
export async function navigationLabels(page: Page): Promise<string[]> {
  const nav = page.getByTestId('main-nav');
  await nav.waitFor();
  return (await nav.locator('.mantine-NavLink-label').allTextContents()).map((t) => t.trim());
}
