import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { PdfReport } from './pdf-report.js';

const scratch = mkdtempSync(join(tmpdir(), 'hb-report-pdf-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

async function textOf(report: PdfReport): Promise<string> {
  const file = await report.toFile('report.pdf');
  const chunks: Buffer[] = [];
  for await (const chunk of file.getStream()) chunks.push(chunk as Buffer);
  const path = join(scratch, 'report.pdf');
  writeFileSync(path, Buffer.concat(chunks));
  return execFileSync('/usr/bin/pdftotext', ['-layout', path, '-'], { encoding: 'utf8' });
}

describe('printed report', () => {
  it('embeds a Lato that has the Latin Extended letters of household names', async () => {
    // A glyph the font lacks comes out of pdftotext as nothing, so each name must survive whole.
    const names = ['Dvořák', 'Łukasz', 'Müller-Šimek', 'Gősi Ödön'];
    const report = new PdfReport('Square-up 2025', 'Households of the Vrbová outfit')
      .heading('Balances')
      .table([{ header: 'Household', width: 3 }, { header: 'Balance', width: 1, align: 'right' }], names.map((n) => [n, '$12.50']));
    const text = await textOf(report);
    for (const words of ['Households of the Vrbová outfit', ...names]) expect(text, words).toContain(words);
  });
});
