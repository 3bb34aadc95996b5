import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrlOrThrow, DEMO_SIGN_INS, DESKTOP, inFreshPage, launchBrowser, screenshot, signInAndWait } from './browser.js';

/** The served web app under its content security policy, as a browser meets it. */

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

function cspOf(header: string | null): Map<string, string> {
  return new Map(
    (header ?? '')
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((p) => p[0])
      .map(([name, ...values]) => [name!, values.join(' ')]),
  );
}

describe('content security policy of the served app', () => {
  it('covers the app shell, the service worker and the manifest, and the shell runs no inline script', async () => {
    const base = baseUrlOrThrow();
    const shell = await fetch(`${base}/machines`);
    expect(shell.status).toBe(200);
    const csp = cspOf(shell.headers.get('content-security-policy'));
    expect(csp.get('script-src')).toBe("'self'");
    expect(csp.get('worker-src')).toBe("'self'");
    expect(csp.get('manifest-src')).toBe("'self'");
    expect(csp.get('frame-ancestors')).toBe("'none'");
    expect(shell.headers.get('x-content-type-options')).toBe('nosniff');
    const html = await shell.text();
    const scripts = html.match(/<script\b[^>]*>[\s\S]*?<\/script>/g) ?? [];
    expect(scripts.length).toBeGreaterThan(0);
    // Inline script would need 'unsafe-inline' or its hash in script-src; the built shell loads files only.
    for (const tag of scripts) expect(tag, tag).toMatch(/^<script\b[^>]*\bsrc="\/[^"]+"[^>]*><\/script>$/);

    const manifestHref = /<link rel="manifest" href="([^"]+)"/.exec(html)?.[1];
    for (const path of ['/sw.js', manifestHref].filter((p): p is string => !!p)) {
      const res = await fetch(`${base}${path}`);
      expect(res.status, path).toBe(200);
      expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
      // A service worker or manifest cached for a year would keep an old app alive after a release.
      expect(res.headers.get('cache-control'), path).toBe('no-cache');
    }
    expect((await fetch(`${base}/sw.js`)).headers.get('content-type')).toMatch(/javascript/);
  });

  it('lets the signed-in app draw its screens and register its service worker without one CSP violation', async () => {
    await inFreshPage(browser, DESKTOP, 'csp-violations', async ({ page, foreignRequests }) => {
      const violations: string[] = [];
      await page.addInitScript(() => {
        document.addEventListener('securitypolicyviolation', (e) => {
          (window as unknown as { __cspViolations: string[] }).__cspViolations ??= [];
          (window as unknown as { __cspViolations: string[] }).__cspViolations.push(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}:${e.lineNumber}:${e.columnNumber}`);
        });
      });
      page.on('console', (msg) => {
        if (/Content Security Policy/i.test(msg.text())) violations.push(msg.text());
      });
      await signInAndWait(page, DEMO_SIGN_INS.owner);
      // The cab form is a page of its own (no office frame, so no user menu): it is drawn once its field picker is.
      for (const [path, drawn] of [['/machines', 'user-menu'], ['/work/log', 'entry-field'], ['/work', 'user-menu'], ['/invoices', 'user-menu']] as const) {
        await page.goto(`${baseUrlOrThrow()}${path}`);
        await page.getByTestId(drawn).waitFor();
        await page.waitForLoadState('networkidle');
        violations.push(...(await page.evaluate(() => (window as unknown as { __cspViolations?: string[] }).__cspViolations ?? [])));
      }
      await screenshot(page, 'csp-signed-in-invoices');
      const worker = await page.evaluate(async () => {
        const registration = await Promise.race([navigator.serviceWorker.ready, new Promise<null>((r) => setTimeout(() => r(null), 15_000))]);
        return registration?.active?.scriptURL ?? null;
      });
      expect(worker).toBe(`${baseUrlOrThrow()}/sw.js`);
      expect(violations).toEqual([]);
      expect(foreignRequests).toEqual([]);
    });
  }, 90_000);
});
