import { MAX_ENTRY_PHOTOS, MAX_UPLOAD_BYTES } from '@hitchbook/shared/upload-limits';

/** What the server takes (it checks the content again); a phone camera saves JPEG. */
const PHOTO_TYPES = new Set(['image/jpeg', 'image/png']);

export interface PhotoChoice {
  accepted: File[];
  /** One line per file left out, naming it and why. */
  refused: string[];
}

export interface PhotoLimits {
  perEntry: number;
  bytesPerPhoto: number;
}

/** What the server keeps with one entry. */
export const SERVER_PHOTO_LIMITS: PhotoLimits = { perEntry: MAX_ENTRY_PHOTOS, bytesPerPhoto: MAX_UPLOAD_BYTES };

const mb = (bytes: number) => `${Number((bytes / (1024 * 1024)).toFixed(1))} MB`;

/** Sorts picked files into those worth sending and those that would be refused anyway. */
export function choosePhotos(picked: readonly File[], alreadyHeld: number, limits: PhotoLimits = SERVER_PHOTO_LIMITS): PhotoChoice {
  const accepted: File[] = [];
  const refused: string[] = [];
  for (const file of picked) {
    if (!PHOTO_TYPES.has(file.type)) refused.push(`${file.name}: only JPEG or PNG photos can be attached.`);
    else if (file.size > limits.bytesPerPhoto) refused.push(`${file.name}: a photo may be at most ${mb(limits.bytesPerPhoto)}.`);
    else if (file.size === 0) refused.push(`${file.name}: the file is empty.`);
    else if (alreadyHeld + accepted.length >= limits.perEntry) refused.push(`${file.name}: an entry holds at most ${limits.perEntry} photo${limits.perEntry === 1 ? '' : 's'}.`);
    else accepted.push(file);
  }
  return { accepted, refused };
}
