import { MAX_UPLOAD_BYTES } from '@hitchbook/shared/schemas/machines';
import { MAX_ENTRY_PHOTOS } from '@hitchbook/shared/schemas/work-entries';

/** What the server takes (it checks the content again); a phone camera saves JPEG. */
const PHOTO_TYPES = new Set(['image/jpeg', 'image/png']);

export interface PhotoChoice {
  accepted: File[];
  /** One line per file left out, naming it and why. */
  refused: string[];
}

/** Sorts picked files into those worth sending and those the server would refuse anyway. */
export function choosePhotos(picked: readonly File[], alreadyHeld: number): PhotoChoice {
  const accepted: File[] = [];
  const refused: string[] = [];
  for (const file of picked) {
    if (!PHOTO_TYPES.has(file.type)) refused.push(`${file.name}: only JPEG or PNG photos can be attached.`);
    else if (file.size > MAX_UPLOAD_BYTES) refused.push(`${file.name}: a photo may be at most ${MAX_UPLOAD_BYTES / (1024 * 1024)} MB.`);
    else if (file.size === 0) refused.push(`${file.name}: the file is empty.`);
    else if (alreadyHeld + accepted.length >= MAX_ENTRY_PHOTOS) refused.push(`${file.name}: an entry holds at most ${MAX_ENTRY_PHOTOS} photos.`);
    else accepted.push(file);
  }
  return { accepted, refused };
}
