/**
 * How much photo a phone keeps while it waits for signal. Phones take photos of several MB; the
 * form downscales them first, and these limits keep a week in the hills from filling the phone
 * or the browser's storage quota (common practice, no source).
 */
export const PHOTO_BUDGET = {
  perEntry: 3,
  bytesPerPhoto: 2 * 1024 * 1024,
  bytesOnPhone: 24 * 1024 * 1024,
} as const;

export interface PhotoLike {
  name: string;
  size: number;
}

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** The budget in words, for the form and the queue status. */
export function photoBudgetLine(bytesWaiting: number): string {
  return `Photos waiting on this phone: ${mb(bytesWaiting)} of ${mb(PHOTO_BUDGET.bytesOnPhone)}. At most ${PHOTO_BUDGET.perEntry} photos per entry, ${mb(PHOTO_BUDGET.bytesPerPhoto)} each.`;
}

/** Why these photos cannot be kept with one entry, or null when they fit. */
export function photoBudgetProblem(photos: readonly PhotoLike[], bytesAlreadyWaiting: number): string | null {
  if (photos.length > PHOTO_BUDGET.perEntry) return `At most ${PHOTO_BUDGET.perEntry} photos per entry; remove ${photos.length - PHOTO_BUDGET.perEntry}.`;
  const tooBig = photos.find((p) => p.size > PHOTO_BUDGET.bytesPerPhoto);
  if (tooBig) return `${tooBig.name} is ${mb(tooBig.size)}; a photo kept on the phone may be at most ${mb(PHOTO_BUDGET.bytesPerPhoto)}.`;
  const total = photos.reduce((sum, p) => sum + p.size, 0);
  if (bytesAlreadyWaiting + total > PHOTO_BUDGET.bytesOnPhone) {
    return `The phone already keeps ${mb(bytesAlreadyWaiting)} of photos waiting for signal; these ${mb(total)} would pass the ${mb(PHOTO_BUDGET.bytesOnPhone)} it keeps. Send the waiting entries first, or leave some photos out.`;
  }
  return null;
}
