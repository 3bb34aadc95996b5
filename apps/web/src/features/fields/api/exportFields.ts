import { downloadFile } from '../../../lib/fileTransfer';
import type { FieldFilters } from './listFields';

/** Every field and road stretch the filters match, in the table's order, as the server writes it (safe against spreadsheet formulas). */
export function exportFields({ q, sort, kind, farmLabel, ownerPartyId, archived }: Omit<FieldFilters, 'page' | 'pageSize'>) {
  return downloadFile('/api/fields/export.csv', { q, sort, kind, farmLabel, ownerPartyId, archived }, 'fields.csv');
}
