import { describe, expect, it } from 'vitest';
import type { ImportReport } from '@hitchbook/shared/schemas/work-entries';
import { FileTransferError } from '../../lib/fileTransfer';
import { canCommit, errorsPage, PREVIEW_COLUMNS, reportOfRefusal, rowsToCreate } from './importReport';

function report(patch: Partial<ImportReport>): ImportReport {
  return { kind: 'entries', mode: 'preview', total: 3, valid: 3, invalid: 0, skipped: 0, created: 0, errors: [], skippedRows: [], rows: [], ...patch };
}

describe('import preview', () => {
  it('can be committed only when no row has an error and something is new', () => {
    expect(canCommit(report({}))).toBe(true);
    expect(canCommit(report({ valid: 2, invalid: 1, errors: [{ row: 3, column: 'hours', reason: 'Must be at most 24' }] }))).toBe(false);
    expect(canCommit(report({ skipped: 3 }))).toBe(false);
    expect(canCommit(null)).toBe(false);
  });

  it('counts the rows a commit would write, leaving out those already imported', () => {
    expect(rowsToCreate(report({ valid: 5, skipped: 2 }))).toBe(3);
    expect(rowsToCreate(report({ mode: 'commit', created: 4 }))).toBe(4);
  });

  it('pages through a long list of row errors', () => {
    const errors = Array.from({ length: 120 }, (_, i) => ({ row: i + 2, column: 'date', reason: 'Not a date' }));
    expect(errorsPage(errors, 3, 50).map((e) => e.row)).toEqual(errors.slice(100).map((e) => e.row));
  });

  it('prints a fuel ticket’s amount as money from its decimal string', () => {
    const amount = PREVIEW_COLUMNS.fuel.find((c) => c.header === 'Amount')!;
    expect(amount.cell({ amount: '1312.40' })).toBe('$1,312.40');
  });
});

describe('a refused commit', () => {
  it('gives back the report the server sent with its 400', () => {
    const body = { message: 'Nothing was imported: 1 row needs attention.', ...report({ mode: 'commit', invalid: 1, errors: [{ row: 4, column: 'field', reason: 'No such field' }] }) };
    expect(reportOfRefusal(new FileTransferError(400, body.message, [], body))?.errors).toEqual([{ row: 4, column: 'field', reason: 'No such field' }]);
  });

  it('has no report for other failures', () => {
    expect(reportOfRefusal(new FileTransferError(413, 'Too large', [], null))).toBeNull();
    expect(reportOfRefusal(new Error('offline'))).toBeNull();
  });
});
