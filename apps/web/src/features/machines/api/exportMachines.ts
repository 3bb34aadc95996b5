import { downloadFile } from '../../../lib/fileTransfer';

export interface MachineExportFilters {
  q?: string;
  sort?: string;
  status?: string;
  kind?: string;
  classId?: string;
}

/** The filtered fleet, every page of it, as the server writes it (prices only for roles that see money). */
export function exportMachines(filters: MachineExportFilters) {
  return downloadFile('/api/machines/export.csv', { ...filters }, 'machines.csv');
}
