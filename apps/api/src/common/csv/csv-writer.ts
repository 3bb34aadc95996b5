import { Readable } from 'node:stream';
import { StreamableFile } from '@nestjs/common';

/**
 * Spreadsheets treat a cell starting with one of these as a formula (or strip the character and then
 * do): =, +, -, @ (OWASP "CSV Injection"; ASVS 1.2.10), tab and NUL, and carriage return (CWE-1236).
 */
const FORMULA_TRIGGER = /^[=+\-@\t\r\0]/;

/** A plain decimal as validation produces it; only these go out unescaped, so `-12.50` stays a number. */
const PLAIN_NUMBER = /^-?\d+(?:\.\d+)?$/;

/**
 * Excel opens a BOM-less UTF-8 file in the machine's legacy code page and garbles every accented
 * name; with the byte-order mark it reads UTF-8. LibreOffice, Numbers and our own import accept it.
 */
export const UTF8_BOM = '\uFEFF';

export type CsvCellKind = 'text' | 'number';

export interface CsvColumn<T> {
  header: string;
  /** Numbers are written as they are; anything else is text and neutralised. Defaults to text. */
  kind?: CsvCellKind;
  value: (row: T) => string | number | null | undefined;
}

/** Prefixes a cell a spreadsheet would evaluate with an apostrophe, so it shows as text. */
export function neutraliseFormula(text: string): string {
  return FORMULA_TRIGGER.test(text) ? `'${text}` : text;
}

/** RFC 4180 §2.6–2.7: quote a field holding a comma, quote or line break; double the quotes inside. */
export function quoteCsvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvCell(value: string | number | null | undefined, kind: CsvCellKind = 'text'): string {
  if (value === null || value === undefined) return '';
  const text = String(value);
  // A "number" that is not a plain decimal is treated as text: the escape is never skipped on a guess.
  if (kind === 'number' && PLAIN_NUMBER.test(text)) return text;
  return quoteCsvField(neutraliseFormula(text));
}

/** One record, terminated by CRLF as RFC 4180 §2.1 prescribes. */
export function csvRecord(cells: readonly string[]): string {
  return `${cells.join(',')}\r\n`;
}

export function csvHeader<T>(columns: readonly CsvColumn<T>[]): string {
  return csvRecord(columns.map((c) => csvCell(c.header)));
}

export function csvRow<T>(columns: readonly CsvColumn<T>[], row: T): string {
  return csvRecord(columns.map((c) => csvCell(c.value(row), c.kind)));
}

/** RFC 6266 attachment header: an ASCII fallback name plus the UTF-8 name (RFC 8187). */
export function attachmentDisposition(filename: string): string {
  const ascii = filename.replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 120) || 'export.csv';
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
}

async function* csvChunks<T>(columns: readonly CsvColumn<T>[], batches: AsyncIterable<readonly T[]>): AsyncGenerator<string> {
  yield UTF8_BOM + csvHeader(columns);
  for await (const batch of batches) {
    if (batch.length > 0) yield batch.map((row) => csvRow(columns, row)).join('');
  }
}

/**
 * A CSV download streamed batch by batch: the whole file is never held in memory, and the
 * response is an attachment so a browser never renders it inside the app's origin.
 */
export function csvDownload<T>(filename: string, columns: readonly CsvColumn<T>[], batches: AsyncIterable<readonly T[]>): StreamableFile {
  const stream = Readable.from(csvChunks(columns, batches), { objectMode: false });
  return new StreamableFile(stream, { type: 'text/csv; charset=utf-8', disposition: attachmentDisposition(filename) });
}
