import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { attachmentDisposition, csvCell, csvDownload, neutraliseFormula, quoteCsvField, UTF8_BOM, type CsvColumn } from './csv-writer.js';

async function text(stream: Readable): Promise<string> {
  const parts: Buffer[] = [];
  for await (const chunk of stream) parts.push(Buffer.from(chunk));
  return Buffer.concat(parts).toString('utf8');
}

describe('neutraliseFormula', () => {
  it.each(['=HYPERLINK("http://x")', '+1+2', '-2+3', '@SUM(A1)', '\tcmd', '\rcmd', '\0x'])(
    'prefixes %j with an apostrophe (OWASP CSV Injection; ASVS 1.2.10; CWE-1236 for CR)',
    (value) => {
      expect(neutraliseFormula(value)).toBe(`'${value}`);
    },
  );

  it('leaves ordinary text alone, including a formula character later in the cell', () => {
    expect(neutraliseFormula('North 40 = wet')).toBe('North 40 = wet');
  });
});

describe('csvCell', () => {
  it('quotes commas, quotes and line breaks per RFC 4180 §2.6–2.7', () => {
    expect(quoteCsvField('Brandvold, Marisol')).toBe('"Brandvold, Marisol"');
    expect(quoteCsvField('the "big" cutter')).toBe('"the ""big"" cutter"');
    expect(quoteCsvField('line\nbreak')).toBe('"line\nbreak"');
  });

  it('neutralises before quoting, so a quoted formula is still text', () => {
    expect(csvCell('=1+2,3')).toBe(`"'=1+2,3"`);
  });

  it('writes plain numbers as numbers, negative ones included, and escapes a number column that is not a number', () => {
    expect(csvCell('-12.50', 'number')).toBe('-12.50');
    expect(csvCell('-12.50')).toBe(`'-12.50`);
    expect(csvCell('=cmd|"/c calc"!A0', 'number')).toBe(`"'=cmd|""/c calc""!A0"`);
    expect(csvCell(null)).toBe('');
  });
});

describe('attachmentDisposition', () => {
  it('names the file as an attachment with an ASCII fallback (RFC 6266)', () => {
    expect(attachmentDisposition('work-entries 2025.csv')).toBe(`attachment; filename="work-entries_2025.csv"; filename*=UTF-8''work-entries%202025.csv`);
    expect(attachmentDisposition('"; evil.html')).toMatch(/^attachment; filename="_evil.html"/);
  });
});

describe('csvDownload', () => {
  it('streams a BOM, the header and every batch as CRLF records', async () => {
    const columns: CsvColumn<{ name: string; acres: string }>[] = [
      { header: 'field', value: (r) => r.name },
      { header: 'acres', kind: 'number', value: (r) => r.acres },
    ];
    async function* batches() {
      yield [{ name: 'Home 40', acres: '40.000' }];
      yield [];
      yield [{ name: '@risk', acres: '-1.5' }];
    }
    const file = csvDownload('x.csv', columns, batches());
    expect(file.getHeaders()).toMatchObject({ type: 'text/csv; charset=utf-8', disposition: 'attachment; filename="x.csv"; filename*=UTF-8\'\'x.csv' });
    expect(await text(file.getStream() as Readable)).toBe(`${UTF8_BOM}field,acres\r\nHome 40,40.000\r\n'@risk,-1.5\r\n`);
  });
});
