import { Readable } from 'node:stream';
import Papa from 'papaparse';

/** A problem with one cell or record, by spreadsheet row (the header is row 1). */
export interface CsvRowProblem {
  row: number;
  column: string;
  reason: string;
}

/** The file as a whole cannot be read: not UTF-8, no header, unknown columns, too many rows. */
export class CsvFileError extends Error {
  constructor(
    message: string,
    readonly details: string[] = [],
  ) {
    super(message);
  }
}

export interface CsvColumnSpec {
  header: string;
  required: boolean;
}

export interface CsvTableOptions {
  columns: readonly CsvColumnSpec[];
  maxRows: number;
  maxFieldLength: number;
}

export interface CsvDataRow {
  row: number;
  /** Cells by the column's documented header; a Map, so a header such as `__proto__` is only a key. */
  cells: Map<string, string>;
  problems: CsvRowProblem[];
}

/** Headers match ignoring case, spaces, dashes and underscores: "Operator E-mail" is "operator email". */
export function headerKey(header: string): string {
  return header.toLowerCase().replace(/[\s_-]+/g, '');
}

const CHUNK_BYTES = 64 * 1024;

/** Decodes slice by slice, refusing bytes that are not UTF-8 instead of replacing them silently. */
function* utf8Chunks(buffer: Buffer): Generator<string> {
  // The decoder drops a leading byte-order mark, as spreadsheet exports often write one.
  const decoder = new TextDecoder('utf-8', { fatal: true });
  for (let offset = 0; offset < buffer.length; offset += CHUNK_BYTES) {
    let text: string;
    try {
      text = decoder.decode(buffer.subarray(offset, offset + CHUNK_BYTES), { stream: true });
    } catch {
      throw new CsvFileError('The file is not UTF-8 text. Save it as "CSV UTF-8" and upload it again.');
    }
    if (text.includes('\u0000')) throw new CsvFileError('The file holds binary data, not CSV text.');
    if (text) yield text;
  }
  try {
    const rest = decoder.decode();
    if (rest) yield rest;
  } catch {
    throw new CsvFileError('The file is not UTF-8 text. Save it as "CSV UTF-8" and upload it again.');
  }
}

/**
 * Streams the CSV records of an uploaded buffer through papaparse, one record at a time, without
 * ever holding the whole file as one string. Row numbers count every record, blank ones included,
 * so they match the spreadsheet the file came from.
 */
export function readCsvRecords(
  buffer: Buffer,
  onRecord: (cells: string[], row: number, parseErrors: string[]) => 'continue' | 'stop' | Promise<'continue' | 'stop'>,
): Promise<void> {
  return new Promise((resolve, reject) => {
    let row = 0;
    let failure: unknown = null;
    let settled = false;
    const fail = (err: unknown) => {
      if (!settled) reject(err);
      settled = true;
    };
    const source = Readable.from(utf8Chunks(buffer));
    Papa.parse<string[]>(source as unknown as File, {
      header: false,
      dynamicTyping: false,
      skipEmptyLines: false,
      step: (results, parser) => {
        row += 1;
        try {
          const errors = results.errors.map((e) => e.message);
          const next = onRecord(results.data, row, errors);
          if (typeof next === 'string') {
            if (next === 'stop') parser.abort();
            return;
          }
          // Asynchronous work on a record (a batch written) holds the parser, so unread records stay unread bytes.
          parser.pause();
          next.then(
            (answer) => (answer === 'stop' ? parser.abort() : parser.resume()),
            (err: unknown) => {
              fail(err);
              parser.abort();
            },
          );
        } catch (err) {
          failure = err;
          parser.abort();
        }
      },
      complete: () => {
        if (failure) fail(failure);
        else if (!settled) {
          settled = true;
          resolve();
        }
      },
      error: (err: unknown) => fail(err instanceof CsvFileError ? err : new CsvFileError('The file could not be read as CSV.')),
    });
  });
}

function isBlank(cells: readonly string[]): boolean {
  return cells.every((c) => c.trim() === '');
}

/**
 * Reads a CSV with a header row against the documented columns: unknown, repeated or missing
 * required headers fail the whole file; each data row comes with its own problems named.
 */
export async function readCsvTable(buffer: Buffer, options: CsvTableOptions, onRow: (row: CsvDataRow) => unknown): Promise<{ rows: number }> {
  const known = new Map(options.columns.map((c) => [headerKey(c.header), c.header]));
  let header: string[] | null = null;
  let dataRows = 0;

  await readCsvRecords(buffer, (cells, row, parseErrors) => {
    if (header === null) {
      if (isBlank(cells)) return 'continue';
      header = resolveHeader(cells, known, options.columns);
      return 'continue';
    }
    if (isBlank(cells)) return 'continue';
    dataRows += 1;
    if (dataRows > options.maxRows) throw new CsvFileError(`The file has more than ${options.maxRows} rows; split it into smaller files.`);
    const done = onRow(toDataRow(header, cells, row, parseErrors, options.maxFieldLength));
    // A promise from onRow (a batch being written) holds the reading until it settles.
    return done instanceof Promise ? done.then(() => 'continue' as const) : 'continue';
  });

  if (header === null) throw new CsvFileError('The file is empty: it needs a header row and at least one row of data.');
  return { rows: dataRows };
}

function resolveHeader(cells: string[], known: Map<string, string>, columns: readonly CsvColumnSpec[]): string[] {
  const problems: string[] = [];
  const seen = new Set<string>();
  const header = cells.map((cell, i) => {
    const name = known.get(headerKey(cell));
    if (!name) {
      problems.push(cell.trim() === '' ? `Column ${i + 1} has no header.` : `Unknown column "${cell.trim().slice(0, 60)}".`);
      return '';
    }
    if (seen.has(name)) problems.push(`The column "${name}" appears twice.`);
    seen.add(name);
    return name;
  });
  for (const c of columns) if (c.required && !seen.has(c.header)) problems.push(`The required column "${c.header}" is missing.`);
  if (problems.length > 0) {
    const expected = columns.map((c) => c.header).join(', ');
    throw new CsvFileError(`The header row does not match the template (columns: ${expected}).`, problems);
  }
  return header;
}

function toDataRow(header: string[], cells: string[], row: number, parseErrors: string[], maxFieldLength: number): CsvDataRow {
  const problems: CsvRowProblem[] = parseErrors.map((reason) => ({ row, column: '', reason: `Not valid CSV here: ${reason}.` }));
  const extra = cells.slice(header.length);
  if (cells.length < header.length || extra.some((c) => c.trim() !== '')) {
    problems.push({ row, column: '', reason: `Has ${cells.length} cells; the header has ${header.length}.` });
  }
  const map = new Map<string, string>();
  header.forEach((name, i) => {
    const value = (cells[i] ?? '').trim();
    if (value.length > maxFieldLength) problems.push({ row, column: name, reason: `Longer than ${maxFieldLength} characters.` });
    map.set(name, value);
  });
  return { row, cells: map, problems };
}
