import { describe, expect, it } from 'vitest';
import { CsvFileError, headerKey, readCsvTable, type CsvDataRow } from './csv-reader.js';

const columns = [
  { header: 'date', required: true },
  { header: 'operator email', required: true },
  { header: 'notes', required: false },
];

async function read(content: string | Buffer, maxRows = 100): Promise<CsvDataRow[]> {
  const rows: CsvDataRow[] = [];
  await readCsvTable(Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), { columns, maxRows, maxFieldLength: 50 }, (r) => rows.push(r));
  return rows;
}

async function fileError(content: string | Buffer): Promise<CsvFileError> {
  try {
    await read(content);
  } catch (err) {
    if (err instanceof CsvFileError) return err;
    throw err;
  }
  throw new Error('the file was accepted');
}

describe('headerKey', () => {
  it('ignores case, spaces, dashes and underscores', () => {
    expect(headerKey(' Operator E-mail ')).toBe(headerKey('operator_email'));
  });
});

describe('readCsvTable', () => {
  it('maps cells by header, numbers rows as a spreadsheet does and keeps quoted line breaks in one row', async () => {
    const rows = await read('\uFEFFDate,Operator E-mail,Notes\r\n2025-06-03,a@x.test,"two\nlines, one cell"\r\n\r\n2025-06-04,b@x.test,\r\n');
    expect(rows.map((r) => r.row)).toEqual([2, 4]);
    expect(rows[0]!.cells.get('notes')).toBe('two\nlines, one cell');
    expect(rows[1]!.cells.get('operator email')).toBe('b@x.test');
    expect(rows.every((r) => r.problems.length === 0)).toBe(true);
  });

  it('decodes a multi-byte character that straddles two 64 KiB read chunks', async () => {
    const padding = 'x'.repeat(64 * 1024 - 'date,operator email,notes\n2025-06-03,a@x.test,'.length - 1);
    const rows = await read(`date,operator email,notes\n2025-06-03,a@x.test,${padding}é\n`);
    expect(rows[0]!.cells.get('notes')?.endsWith('é')).toBe(true);
  });

  it('names cells that are too long and rows with the wrong number of cells', async () => {
    const rows = await read(`date,operator email,notes\n2025-06-03,a@x.test,${'n'.repeat(51)}\n2025-06-04\n`);
    expect(rows[0]!.problems).toEqual([{ row: 2, column: 'notes', reason: 'Longer than 50 characters.' }]);
    expect(rows[1]!.problems.map((p) => p.reason)).toEqual(['Has 1 cells; the header has 3.']);
  });

  it('refuses unknown, repeated and missing columns, naming each; a __proto__ header is just unknown', async () => {
    const err = await fileError('date,date,__proto__\n2025-06-03,x,y\n');
    expect(err.details).toEqual(['The column "date" appears twice.', 'Unknown column "__proto__".', 'The required column "operator email" is missing.']);
  });

  it('refuses bytes that are not UTF-8, binary data, an empty file and too many rows', async () => {
    expect((await fileError(Buffer.from([0x64, 0x61, 0x74, 0x65, 0x0a, 0xc3, 0x28]))).message).toContain('not UTF-8');
    expect((await fileError('date,operator email\n\u0000\n')).message).toContain('binary');
    expect((await fileError('\n\n')).message).toContain('empty');
    const many = `date,operator email\n${'2025-06-03,a@x.test\n'.repeat(101)}`;
    expect((await fileError(many)).message).toContain('more than 100 rows');
  });

  it('reads 10,000 rows', async () => {
    const rows = await read(`date,operator email,notes\n${'2025-06-03,a@x.test,"a, b"\n'.repeat(10_000)}`, 20_000);
    expect(rows).toHaveLength(10_000);
    expect(rows[9_999]!.row).toBe(10_001);
  });
});
