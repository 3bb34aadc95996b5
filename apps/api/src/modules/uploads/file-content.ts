import { boundaryGeometrySchema, type BoundaryGeometry } from '@hitchbook/shared/schemas/fields';
import { fileTypeFromBuffer } from 'file-type';
import { AppError, invalid } from '../../common/errors/app-error.js';
import { issuesOf } from '../../common/validation/zod.pipe.js';
import type { UploadPurpose } from '@hitchbook/shared/schemas/machines';
import { GEOJSON, PURPOSES, type FileKind } from './upload-kinds.js';

/**
 * What the file really is, from its bytes: the magic number for binary files, a full parse for GeoJSON
 * (text has no magic number). The client's Content-Type is never consulted; the name's extension must
 * agree with the content, so "invoice.pdf" holding HTML is refused.
 */
export async function fileKindOrThrow(data: Buffer, originalName: string, purpose: UploadPurpose): Promise<FileKind> {
  if (data.length === 0) throw invalid('file', 'The file is empty.');
  const { kinds } = PURPOSES[purpose];
  let kind: FileKind | undefined;
  if (kinds.includes(GEOJSON)) {
    boundaryFromFileOrThrow(data, 'file');
    kind = GEOJSON;
  } else {
    const sniffed = await fileTypeFromBuffer(data);
    kind = kinds.find((k) => k.contentType === sniffed?.mime);
    if (!kind) {
      const expected = kinds.map((k) => k.label).join(', ');
      throw invalid('file', `A ${purpose} must be a ${expected}; this file's content is ${sniffed ? sniffed.mime : 'none of these'}.`);
    }
  }
  const extension = extensionOf(originalName);
  if (extension !== null && !kind.extensions.includes(extension)) {
    throw invalid('file', `The file is named .${extension} but its content is a ${kind.label}; rename it to .${kind.extensions[0]}.`);
  }
  return kind;
}

/** A stored field-boundary file as a checked geometry; issues are reported under `path`. */
export function boundaryFromFileOrThrow(data: Buffer, path: string): BoundaryGeometry {
  let parsed: unknown;
  try {
    parsed = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(data));
  } catch {
    throw invalid(path, 'A boundary file must be GeoJSON text (UTF-8 JSON).');
  }
  const result = boundaryGeometrySchema.safeParse(parsed);
  if (!result.success) {
    const issues = issuesOf(result.error).map((i) => ({ path: i.path ? `${path}.${i.path}` : path, message: i.message }));
    throw new AppError('validation', 'The boundary file is not a usable GeoJSON polygon.', issues);
  }
  return result.data;
}

function extensionOf(name: string): string | null {
  const dot = name.lastIndexOf('.');
  return dot > 0 && dot < name.length - 1 ? name.slice(dot + 1).toLowerCase() : null;
}

/** The caller's file name, cut to its last path segment and stripped of control characters. */
export function safeFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const clean = base.replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 180);
  return clean === '' || clean === '.' || clean === '..' ? 'upload' : clean;
}

/** RFC 6266: an ASCII fallback plus the exact name in RFC 5987 encoding. */
export function attachmentDisposition(name: string): string {
  const ascii = name.replace(/[^A-Za-z0-9._ -]/g, '_');
  const encoded = encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}
