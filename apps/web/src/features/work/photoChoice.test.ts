import { describe, expect, it } from 'vitest';
import { MAX_ENTRY_PHOTOS } from '@hitchbook/shared/schemas/work-entries';
import { choosePhotos } from './photoChoice';
import { fittedSize } from './photoScale';

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

  it('holds to tighter limits when given, as for photos that may wait on the phone', () => {
    const { accepted, refused } = choosePhotos([file('a.jpg', 'image/jpeg', 3 * 1024 * 1024), file('b.jpg', 'image/jpeg'), file('c.jpg', 'image/jpeg')], 0, { perEntry: 1, bytesPerPhoto: 2 * 1024 * 1024 });
    expect(accepted.map((f) => f.name)).toEqual(['b.jpg']);
    expect(refused).toEqual(['a.jpg: a photo may be at most 2 MB.', 'c.jpg: an entry holds at most 1 photo.']);
  });
});

describe('fittedSize', () => {
  it('shrinks the longest side to 1600 px keeping the shape, and never enlarges', () => {
    expect(fittedSize(4032, 3024)).toEqual({ width: 1600, height: 1200 });
    expect(fittedSize(3024, 4032)).toEqual({ width: 1200, height: 1600 });
    expect(fittedSize(800, 600)).toEqual({ width: 800, height: 600 });
  });
});
