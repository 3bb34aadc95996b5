/** The longest side a photo keeps: plenty to read a serial plate or see a washout, a few hundred kB as JPEG. */
export const PHOTO_MAX_SIDE = 1600;
const JPEG_QUALITY = 0.82;

/** The size a photo is drawn at to fit within `maxSide`, never enlarged. */
export function fittedSize(width: number, height: number, maxSide = PHOTO_MAX_SIDE): { width: number; height: number } {
  const scale = Math.min(1, maxSide / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

/**
 * A phone photo made small enough to send over a weak signal and to wait on the phone: redrawn as
 * a JPEG no larger than PHOTO_MAX_SIDE. A file the browser cannot decode is returned as it is, for
 * the type check to name.
 */
export async function downscalePhoto(file: File): Promise<File> {
  if (!file.type.startsWith('image/')) return file;
  let bitmap: ImageBitmap;
  try {
    bitmap = await createImageBitmap(file);
  } catch {
    return file;
  }
  try {
    const { width, height } = fittedSize(bitmap.width, bitmap.height);
    if (width === bitmap.width && file.size <= 1024 * 1024 && (file.type === 'image/jpeg' || file.type === 'image/png')) return file;
    const canvas = document.createElement('canvas');
    canvas.width = width;
    canvas.height = height;
    canvas.getContext('2d')!.drawImage(bitmap, 0, 0, width, height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/jpeg', JPEG_QUALITY));
    if (!blob) return file;
    const name = file.name.replace(/\.[^.]*$/, '') + '.jpg';
    return new File([blob], name, { type: 'image/jpeg', lastModified: file.lastModified });
  } finally {
    bitmap.close();
  }
}
