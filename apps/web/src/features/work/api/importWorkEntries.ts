import type { ImportKind, ImportReport } from '@hitchbook/shared/schemas/work-entries';
import { uploadFile } from '../../../lib/fileTransfer';

export type ImportMode = 'preview' | 'commit';

/**
 * Sends the CSV for a preview (nothing written) or a commit (all rows or none). A refused commit
 * answers 400 with the same report, which the caller reads from the error's body.
 */
export function importWorkEntries(kind: ImportKind, mode: ImportMode, file: File, onProgress: (sent: number) => void) {
  return uploadFile<ImportReport>({ path: '/api/work-entries/import', query: { kind, mode }, file, onProgress });
}
