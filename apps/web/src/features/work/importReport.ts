import { formatMoney } from '@hitchbook/shared/money';
import type { ImportKind, ImportReport, ImportRowError } from '@hitchbook/shared/schemas/work-entries';
import { isApiError } from '../../lib/api';
import { FileTransferError } from '../../lib/fileTransfer';
import { formatDecimal } from '../../lib/money';

/** A refused commit answers 400 with the whole report beside the message; anything else has none. */
export function reportOfRefusal(error: unknown): ImportReport | null {
  if (!(error instanceof FileTransferError) || !isApiError(error) || error.status !== 400) return null;
  const body = error.body as Partial<ImportReport> | null;
  return body && Array.isArray(body.errors) && typeof body.total === 'number' ? (body as ImportReport) : null;
}

/** Rows a commit would write (new, without errors). */
export function rowsToCreate(report: ImportReport): number {
  return report.mode === 'commit' ? report.created : report.valid - report.skipped;
}

/** Committing is allowed only for a clean preview with something new in it: all rows or none. */
export function canCommit(report: ImportReport | null): boolean {
  return report !== null && report.mode === 'preview' && report.invalid === 0 && rowsToCreate(report) > 0;
}

export function errorsPage(errors: readonly ImportRowError[], page: number, pageSize: number): ImportRowError[] {
  return errors.slice((page - 1) * pageSize, page * pageSize);
}

export interface PreviewColumn {
  header: string;
  cell: (row: Record<string, unknown>) => string;
}

const str = (key: string) => (row: Record<string, unknown>) => (typeof row[key] === 'string' && row[key] ? String(row[key]) : '—');
const qty = (key: string, places: number) => (row: Record<string, unknown>) =>
  typeof row[key] === 'string' && row[key] ? formatDecimal(row[key], places) : '—';

/** The preview's columns: what each new row will be stored as, in the words of the screens. */
export const PREVIEW_COLUMNS: Record<ImportKind, PreviewColumn[]> = {
  entries: [
    { header: 'Date', cell: str('date') },
    { header: 'Field', cell: str('field') },
    { header: 'Work', cell: str('workType') },
    { header: 'Machines', cell: (r) => [r.powerUnit, r.implement].filter((m) => typeof m === 'string' && m).join(' + ') || '—' },
    { header: 'Operator', cell: str('operatorEmail') },
    { header: 'Hours', cell: qty('hours', 2) },
    { header: 'Acres', cell: qty('acres', 2) },
    { header: 'Bill to', cell: str('billTo') },
  ],
  fuel: [
    { header: 'Date', cell: str('date') },
    { header: 'Machine', cell: str('machine') },
    { header: 'Gallons', cell: qty('gallons', 1) },
    { header: 'Amount', cell: (r) => (typeof r.amount === 'string' ? formatMoney(r.amount) : '—') },
    { header: 'Vendor', cell: str('vendor') },
    { header: 'Paid by', cell: str('paidBy') },
  ],
};
