import { downloadFile } from '../../../lib/fileTransfer';
import { filterQuery, type WorkEntryFilters } from './listWorkEntries';

/** The filtered set, every page of it, as the server writes it (safe against spreadsheet formulas). */
export function exportWorkEntries(filters: WorkEntryFilters) {
  return downloadFile('/api/work-entries/export.csv', filterQuery(filters), 'work-entries.csv');
}
