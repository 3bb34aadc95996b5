import { MONEY_ROLES, STAFF_ROLES, type Role } from '@hitchbook/shared/roles';
import type { UploadPurpose } from '@hitchbook/shared/schemas/machines';
/** Room for the multipart boundaries, part headers and the purpose field around the file. */
export const MULTIPART_OVERHEAD_BYTES = 16 * 1024;

export interface FileKind {
  contentType: string;
  label: string;
  /** Names this kind of file may carry; a name with another extension is refused. */
  extensions: readonly string[];
}

export const PDF: FileKind = { contentType: 'application/pdf', label: 'PDF', extensions: ['pdf'] };
export const JPEG: FileKind = { contentType: 'image/jpeg', label: 'JPEG image', extensions: ['jpg', 'jpeg', 'jpe'] };
export const PNG: FileKind = { contentType: 'image/png', label: 'PNG image', extensions: ['png'] };
export const GEOJSON: FileKind = { contentType: 'application/geo+json', label: 'GeoJSON file', extensions: ['geojson', 'json'] };

export interface PurposeRules {
  kinds: readonly FileKind[];
  /** Who may send such a file. */
  uploaders: readonly Role[];
  /** Who may fetch it again: receipts are money records, the rest is for the whole staff. */
  readers: readonly Role[];
  /** Where such a file is sent instead of POST /api/uploads, when it belongs to one record from the start. */
  sentThrough?: string;
}

export const PURPOSES: Readonly<Record<UploadPurpose, PurposeRules>> = {
  receipt: { kinds: [PDF, JPEG, PNG], uploaders: ['owner', 'partner'], readers: MONEY_ROLES },
  'machine-photo': { kinds: [JPEG, PNG], uploaders: ['owner', 'partner'], readers: STAFF_ROLES },
  // Entry photos are read through their entry (an operator sees only their own), never by id alone.
  'entry-photo': { kinds: [JPEG, PNG], uploaders: ['owner', 'partner', 'operator'], readers: [], sentThrough: 'POST /api/work-entries/:id/photos' },
  'field-boundary': { kinds: [GEOJSON], uploaders: ['owner', 'partner'], readers: STAFF_ROLES },
};
