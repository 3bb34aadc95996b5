import { downloadFile } from '../../../lib/fileTransfer';

export type ReportFile = 'machine-rates.csv' | 'machine-rates.pdf' | 'custom-income.csv';

export function downloadReport(file: ReportFile, year: number) {
  return downloadFile(`/api/reports/${file}`, { year: String(year) }, `${file.replace('.', `-${year}.`)}`);
}
