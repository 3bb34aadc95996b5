import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build, type Manifest } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// The structure behind the bundle budget (npm run bench measures the bytes): opened straight, the sign-in page
// and the cab form are lean apps of their own, without the office app's router, and every office page is a chunk
// of its own. The sign-in page loads none of the signed-in app (query cache, toasts, form recipe, zod); the cab
// form loads no query cache or form library and fetches zod and the phone queue only once it is drawn. It builds
// the app itself, so it checks the sources as they are rather than whatever dist was built last.

const webRoot = fileURLToPath(new URL('../..', import.meta.url));
const HEAVY_PACKAGES = /node_modules\/(mantine-react-table|@tanstack\/react-table|@mantine\/charts|recharts|d3-[a-z-]+|@mantine\/dates|dayjs|@mantine\/dropzone|react-dropzone)\//;
// The entry picks one app (the office app, or the lean sign-in or cab page) and the office app its routes.
const ROUTE_MODULE = /^src\/(features\/[^/]+\/routes\/|app\/layout\/|app\/App\.tsx$|app\/(cab|signin)\/\w+App\.tsx$)/;
const SIGNED_IN_ONLY = /node_modules\/(zod|@tanstack\/query-core|@tanstack\/react-query|@mantine\/notifications|@mantine\/form|@floating-ui\/[a-z-]+)\//;
const NOT_ON_CAB_FORM = /node_modules\/(zod|idb|@tanstack\/query-core|@tanstack\/react-query|@mantine\/form|@mantine\/notifications|@floating-ui\/[a-z-]+|react-router)\//;
const DEVELOPMENT_BUILDS = /node_modules\/(react-router\/dist\/development)\//;

const SIGN_IN = ['src/app/signin/SignInApp.tsx'];
const CAB_FORM = ['src/app/cab/CabApp.tsx'];
const OFFICE_FRAME = ['src/app/App.tsx', 'src/app/layout/AppLayout.tsx'];
const officePage = (page: string) => [...OFFICE_FRAME, page];

let outDir: string;
let manifest: Manifest;

beforeAll(async () => {
  outDir = mkdtempSync(join(tmpdir(), 'hitchbook-web-split-'));
  await build({
    root: webRoot,
    configFile: join(webRoot, 'vite.config.ts'),
    logLevel: 'error',
    build: { outDir, emptyOutDir: true, manifest: true, sourcemap: true },
  });
  manifest = JSON.parse(readFileSync(join(outDir, '.vite', 'manifest.json'), 'utf8')) as Manifest;
}, 240_000);

afterAll(() => {
  if (outDir) rmSync(outDir, { recursive: true, force: true });
});

function entryKey(): string {
  const keys = Object.keys(manifest).filter((key) => manifest[key]!.isEntry);
  expect(keys).toHaveLength(1);
  return keys[0]!;
}

/** Manifest keys a page needs before it is usable: the entry, what it loads lazily on every page, the route chain. */
function pageChunks(routeChain: string[]): Set<string> {
  const entry = entryKey();
  const everyPage = (manifest[entry]!.dynamicImports ?? []).filter((key) => !ROUTE_MODULE.test(key));
  const seen = new Set<string>();
  const pending = [entry, ...everyPage, ...routeChain];
  while (pending.length > 0) {
    const key = pending.pop()!;
    if (seen.has(key)) continue;
    const chunk = manifest[key];
    if (!chunk) throw new Error(`${key} is not a chunk of its own`);
    seen.add(key);
    pending.push(...(chunk.imports ?? []));
  }
  return seen;
}

function heavySourcesIn(keys: Set<string>, packages = HEAVY_PACKAGES): string[] {
  const found = new Set<string>();
  for (const key of keys) {
    const file = manifest[key]!.file;
    if (!file.endsWith('.js')) continue;
    // Only generated glue (the chunk loader runtime) has no source map, and no package code in it.
    if (!readFileSync(join(outDir, file), 'utf8').includes('sourceMappingURL=')) continue;
    const map = JSON.parse(readFileSync(join(outDir, `${file}.map`), 'utf8')) as { sources: string[] };
    for (const source of map.sources) {
      const match = packages.exec(source);
      if (match) found.add(`${match[1]} (in ${file})`);
    }
  }
  return [...found];
}

function routeModules(): string[] {
  const featuresDir = join(webRoot, 'src', 'features');
  return readdirSync(featuresDir).flatMap((feature) => {
    let files: string[] = [];
    try {
      files = readdirSync(join(featuresDir, feature, 'routes'));
    } catch {
      return [];
    }
    return files.filter((file) => file.endsWith('.tsx')).map((file) => `src/features/${feature}/routes/${file}`);
  });
}

describe('web bundle split', () => {
  it('the sign-in page loads no table, chart, date or upload code, not the signed-in frame and no router', () => {
    const chunks = pageChunks(SIGN_IN);
    expect(heavySourcesIn(chunks)).toEqual([]);
    expect(manifest['src/app/layout/AppLayout.tsx']?.isDynamicEntry).toBe(true);
    expect(chunks.has('src/app/layout/AppLayout.tsx')).toBe(false);
    expect(chunks.has('src/app/App.tsx')).toBe(false);
    expect(heavySourcesIn(chunks, /node_modules\/(react-router)\//)).toEqual([]);
  });

  it('the sign-in page loads no service-worker library, password-input family or record-refusal pages', () => {
    const chunks = pageChunks(SIGN_IN);
    const notOnSignIn =
      /(node_modules\/workbox-window|@mantine\/core\/esm\/components\/(?:PasswordInput|ActionIcon)|src\/components\/Not(?:Found|Allowed))[/.]/;
    expect(heavySourcesIn(chunks, notOnSignIn)).toEqual([]);
    // React Router is one module, so its unused forms and link prefetching show only in the office app's code.
    const office = pageChunks(['src/app/App.tsx']);
    const code = [...office].map((key) => readFileSync(join(outDir, manifest[key]!.file), 'utf8')).join('\n');
    expect(heavySourcesIn(office, /node_modules\/(react-router)\//)).not.toEqual([]);
    expect(code).not.toContain('application/x-www-form-urlencoded');
    expect(code).not.toContain('IntersectionObserver');
    // The signed-in frame still has the refusal pages, where a page can meet a 403 or a 404.
    expect(heavySourcesIn(pageChunks(OFFICE_FRAME), notOnSignIn).join(' ')).toContain('src/components/NotFound');
  });

  it('the cab work-entry form loads no table, chart, date or upload code', () => {
    expect(heavySourcesIn(pageChunks(CAB_FORM))).toEqual([]);
  });

  it('the sign-in page loads no query cache, toasts, form recipe, zod or dropdown code', () => {
    expect(heavySourcesIn(pageChunks(SIGN_IN), SIGNED_IN_ONLY)).toEqual([]);
  });

  it('the cab form loads no router, query cache, form library, toasts or dropdowns, and zod and the queue only after it is drawn', () => {
    const cabForm = pageChunks(CAB_FORM);
    expect(heavySourcesIn(cabForm, NOT_ON_CAB_FORM)).toEqual([]);
    // Zod and the queue still come, fetched by the form once drawn: the entry schema for the checks before
    // sending, and the queue in IndexedDB.
    const fetchedLater = [...cabForm].flatMap((key) => manifest[key]!.dynamicImports ?? []);
    const later = new Set(fetchedLater.flatMap((key) => [...pageChunks([key])]).filter((key) => !cabForm.has(key)));
    const seen = heavySourcesIn(later, NOT_ON_CAB_FORM).join(' ');
    expect(seen).toContain('zod');
    expect(seen).toContain('idb');
  });

  it('the cab form works out its hours without decimal.js', () => {
    expect(heavySourcesIn(pageChunks(CAB_FORM), /node_modules\/(decimal\.js)\//)).toEqual([]);
    // The entries table, on the same data, does load it: the check reads the source maps rather than nothing.
    expect(heavySourcesIn(pageChunks(officePage('src/features/work/routes/WorkEntriesPage.tsx')), /node_modules\/(decimal\.js)\//)).not.toEqual([]);
  });

  it("ships React Router's production build", () => {
    const every = new Set(Object.keys(manifest));
    expect(heavySourcesIn(every, /node_modules\/(react-router\/dist\/production)\//)).not.toEqual([]);
    expect(heavySourcesIn(every, DEVELOPMENT_BUILDS)).toEqual([]);
  });

  it('the check would see the heavy packages where they are used', () => {
    // The entries list is a table page, own-or-hire draws a chart and the CSV import takes a dropped file:
    // if these came back clean, the source-map reading above would be blind rather than the two pages clean.
    const seen = (page: string) => heavySourcesIn(pageChunks(officePage(page))).join(' ');
    expect(seen('src/features/work/routes/WorkEntriesPage.tsx')).toContain('mantine-react-table');
    expect(seen('src/features/estimates/routes/OwnOrHirePage.tsx')).toMatch(/recharts|@mantine\/charts/);
    expect(seen('src/features/work/routes/ImportPage.tsx')).toContain('@mantine/dropzone');
  });

  it('every page of every area is a lazy chunk outside the entry', () => {
    const eager = pageChunks([]);
    const pages = routeModules();
    expect(pages.length).toBeGreaterThan(20);
    for (const page of pages) {
      expect(manifest[page]?.isDynamicEntry, `${page} should be a lazy route chunk`).toBe(true);
      expect(eager.has(page), `${page} should not load with the entry`).toBe(false);
    }
  });
});
