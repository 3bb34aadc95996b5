import { downloadFile } from '../../../lib/fileTransfer';

export function downloadStatement(squareUpId: string, format: 'csv' | 'pdf') {
  return downloadFile(`/api/square-ups/${encodeURIComponent(squareUpId)}/statement.${format}`, undefined, `square-up.${format}`);
}
