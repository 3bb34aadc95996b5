#!/usr/bin/env node
// Renders the app icons from their SVG sources with Debian's chromium; the PNGs are committed.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const iconDir = fileURLToPath(new URL('../public/icons/', import.meta.url));
const renders = [
  { source: 'icon.svg', size: 192, out: 'icon-192.png' },
  { source: 'icon.svg', size: 512, out: 'icon-512.png' },
  { source: 'icon.svg', size: 180, out: 'apple-touch-icon.png' },
  { source: 'icon-maskable.svg', size: 512, out: 'icon-maskable-512.png' },
];

const work = mkdtempSync(join(tmpdir(), 'hitchbook-icons-'));
try {
  for (const { source, size, out } of renders) {
    const svg = readFileSync(join(iconDir, source), 'utf8');
    const page = join(work, `${out}.html`);
    writeFileSync(page, `<html><body style="margin:0;background:transparent">${svg.replace('<svg ', `<svg width="${size}" height="${size}" `)}</body></html>`);
    execFileSync(process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', [
      '--headless', '--no-sandbox', '--disable-gpu', '--hide-scrollbars', '--default-background-color=00000000',
      `--window-size=${size},${size}`, `--screenshot=${join(iconDir, out)}`, `file://${page}`,
    ], { stdio: 'ignore' });
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
