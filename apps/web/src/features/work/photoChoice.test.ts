import { describe, expect, it } from 'vitest';
import { MAX_ENTRY_PHOTOS } from '@hitchbook/shared/schemas/work-entries';
import { choosePhotos } from './photoChoice';

const file = (name: string, type: string, size = 1000) => new File([new Uint8Array(size)], name, { type });

describe('choosePhotos', () => {
  it('keeps JPEG and PNG photos and names each file it leaves out with the reason', () => {
    const { accepted, refused } = choosePhotos(
      [file('pass.jpg', 'image/jpeg'), file('corner.png', 'image/png'), file('scan.pdf', 'application/pdf'), file('IMG_1.HEIC', 'image/heic'), file('huge.jpg', 'image/jpeg', 10 * 1024 * 1024 + 1), file('blank.png', 'image/png', 0)],
      0,
    );
    expect(accepted.map((f) => f.name)).toEqual(['pass.jpg', 'corner.png']);
    expect(refused).toEqual([
      'scan.pdf: only JPEG or PNG photos can be attached.',
      'IMG_1.HEIC: only JPEG or PNG photos can be attached.',
      'huge.jpg: a photo may be at most 10 MB.',
      'blank.png: the file is empty.',
    ]);
  });

  it('stops at the most an entry holds, counting the photos it has already', () => {
    const { accepted, refused } = choosePhotos([file('a.jpg', 'image/jpeg'), file('b.jpg', 'image/jpeg'), file('c.jpg', 'image/jpeg')], MAX_ENTRY_PHOTOS - 2);
    expect(accepted.map((f) => f.name)).toEqual(['a.jpg', 'b.jpg']);
    expect(refused).toEqual([`c.jpg: an entry holds at most ${MAX_ENTRY_PHOTOS} photos.`]);
  });
});
