import { downloadFile } from '../../../lib/fileTransfer';
import type { CostFilters } from './listCostEntries';

/** Every cost the filters match, in the table's order, as the server writes it (safe against spreadsheet formulas). */
export function exportCostEntries(machineId: string, { category, from, to, paidByPartyId, sort }: Omit<CostFilters, 'page' | 'pageSize'>) {
  return downloadFile(`/api/machines/${encodeURIComponent(machineId)}/costs/export.csv`, { category, from, to, paidByPartyId, sort }, 'costs.csv');
}
