#!/usr/bin/env node
// The web bundle figure of the benchmark: gzip bytes of the JavaScript the sign-in page and the cab
// work-entry form need before they can render, against a bare React + Mantine page built the same way.
//
// Measured from the Vite manifest, not by loading the pages in a browser: a page is the entry chunk, the
// lazy modules of its route chain, what the entry itself imports lazily on every page (the service worker
// client), and every chunk those import statically. That needs no API, database or browser,
// gives the same bytes on every run, and names the chunks, so a regression points at its cause. Checked
// against Chromium loading both pages with the service worker blocked: the same files, the same bytes.
// What a page imports only on a user's action (a dialog, a chart drawn later) or fetches once it is drawn (the
// cab form's zod schema, the user menu's dropdown, the toast host) is not counted.
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import { inRepo } from '../lib/paths.mjs';

const WEB_ROOT = inRepo('apps/web');
const BARE_ROOT = inRepo('packages/devstack/bench-bare');

/** Each page's route chain, outermost first, as source paths in apps/web (the manifest's keys). */
export const PAGES = {
  signIn: ['src/app/signin/SignInApp.tsx'],
  cabForm: ['src/app/cab/CabApp.tsx'],
};

// The entry picks one app (the office app, or the lean sign-in or cab page) and the office app its routes.
const ROUTE_MODULE = /^src\/(features\/[^/]+\/routes\/|app\/layout\/|app\/App\.tsx$|app\/(cab|signin)\/\w+App\.tsx$)/;

/** The entry's lazy imports that are not routes: started as soon as the app mounts, whatever the page. */
function everyPageImports(entry) {
  return (entry.dynamicImports ?? []).filter((key) => !ROUTE_MODULE.test(key));
}

/** The chunk files a page loads before it is usable: entry, every-page lazy imports, route modules, their static imports. */
export function chunksOf(manifest, routeChain = []) {
  const entries = Object.keys(manifest).filter((key) => manifest[key].isEntry);
  if (entries.length !== 1) throw new Error(`expected one entry in the Vite manifest, found ${entries.length}`);
  const last = routeChain.at(-1);
  if (last && !manifest[last]) throw new Error(`${last} is not a chunk of its own in the Vite manifest`);
  // A layout that is part of the entry has no manifest key of its own; the entry already counts it.
  const roots = [entries[0], ...everyPageImports(manifest[entries[0]]), ...routeChain.filter((key) => manifest[key])];
  const seen = new Set();
  const pending = [...roots];
  while (pending.length > 0) {
    const key = pending.pop();
    if (seen.has(key)) continue;
    seen.add(key);
    pending.push(...(manifest[key].imports ?? []));
  }
  return [...seen].map((key) => manifest[key].file).filter((file) => file.endsWith('.js'));
}

function gzipBytes(outDir, files) {
  return files.reduce((sum, file) => sum + gzipSync(readFileSync(join(outDir, file))).length, 0);
}

/**
 * What a browser downloads from the API, which sends the build's Brotli copies (files under 1 KiB have none and
 * go as they are): shown beside, not budgeted. The bare page has no build copies; it is compressed here.
 */
function brotliBytes(outDir, files, { asServed }) {
  return files.reduce((sum, file) => {
    const path = join(outDir, file);
    if (!asServed) return sum + brotliCompressSync(readFileSync(path)).length;
    return sum + statSync(existsSync(`${path}.br`) ? `${path}.br` : path).size;
  }, 0);
}

function readManifest(outDir) {
  return JSON.parse(readFileSync(join(outDir, '.vite', 'manifest.json'), 'utf8'));
}

async function viteBuild(root, outDir, extra) {
  const { build } = await import('vite');
  await build({
    root,
    mode: 'production',
    logLevel: 'warn',
    ...extra,
    build: { outDir, emptyOutDir: true, manifest: true, sourcemap: true, ...extra.build },
  });
}

/** Builds the web app and the bare page into a scratch folder and returns gzip bytes per page. */
export async function measureBundles({ details = false } = {}) {
  const scratch = mkdtempSync(join(tmpdir(), 'hitchbook-bundle-'));
  try {
    const appOut = join(scratch, 'web');
    const bareOut = join(scratch, 'bare');
    await viteBuild(WEB_ROOT, appOut, { configFile: join(WEB_ROOT, 'vite.config.ts') });
    const react = (await import('@vitejs/plugin-react')).default;
    await viteBuild(BARE_ROOT, bareOut, { configFile: false, plugins: [react()] });

    const appManifest = readManifest(appOut);
    const pages = Object.fromEntries(Object.entries(PAGES).map(([name, chain]) => [name, chunksOf(appManifest, chain)]));
    const bareChunks = chunksOf(readManifest(bareOut));
    const result = {
      signIn: gzipBytes(appOut, pages.signIn),
      cabForm: gzipBytes(appOut, pages.cabForm),
      bare: gzipBytes(bareOut, bareChunks),
      brotli: {
        signIn: brotliBytes(appOut, pages.signIn, { asServed: true }),
        cabForm: brotliBytes(appOut, pages.cabForm, { asServed: true }),
        bare: brotliBytes(bareOut, bareChunks, { asServed: false }),
      },
    };
    if (!details) return result;
    const perChunk = (outDir, files) =>
      files.map((file) => ({ file, gzip: gzipBytes(outDir, [file]) })).sort((a, b) => b.gzip - a.gzip);
    return {
      ...result,
      chunks: {
        signIn: perChunk(appOut, pages.signIn),
        cabForm: perChunk(appOut, pages.cabForm),
        bare: perChunk(bareOut, bareChunks),
      },
    };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

const kb = (bytes) => `${(bytes / 1024).toFixed(1)} KiB`;

function printTable({ signIn, cabForm, bare, brotli, chunks }, { verbose }) {
  console.log('Web bundle: gzip JavaScript loaded before the page renders (Brotli: as the API sends it)');
  console.log(`  ${'page'.padEnd(26)} ${'gzip'.padStart(10)}  ratio to bare  ${'Brotli'.padStart(10)}`);
  for (const [label, bytes, br] of [
    ['bare React + Mantine', bare, brotli.bare],
    ['sign-in', signIn, brotli.signIn],
    ['cab work-entry form', cabForm, brotli.cabForm],
  ]) {
    console.log(`  ${label.padEnd(26)} ${kb(bytes).padStart(10)}  ${`${(bytes / bare).toFixed(2)}x`.padStart(13)}  ${kb(br).padStart(10)}`);
  }
  console.log('  budget: sign-in and cab form <= 1.30x');
  if (!verbose) return;
  for (const [page, list] of Object.entries(chunks)) {
    console.log(`\n  ${page}:`);
    for (const { file, gzip } of list) console.log(`    ${kb(gzip).padStart(10)}  ${file}`);
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const verbose = process.argv.includes('--chunks');
  measureBundles({ details: true }).then(
    (figures) => printTable(figures, { verbose }),
    (error) => {
      console.error(`✗ ${error.message}`);
      process.exit(1);
    },
  );
}
