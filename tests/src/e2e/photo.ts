import { crc32, deflateSync } from 'node:zlib';

/**
 * A small PNG made here, so the browser tests attach a real photo without a file in the repository:
 * a green field under a blue sky (PNG: signature, IHDR, IDAT, IEND; W3C PNG specification, 2003).
 */
export function fieldPhotoPng(width = 240, height = 160): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const out = Buffer.alloc(8 + data.length + 4);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc32(body) >>> 0, 8 + data.length);
    return out;
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.set([8, 2, 0, 0, 0], 8);
  const rows: Buffer[] = [];
  for (let y = 0; y < height; y++) {
    const row = Buffer.alloc(1 + width * 3);
    for (let x = 0; x < width; x++) {
      const sky = y < height * 0.4;
      const stripe = !sky && Math.floor((x + y) / 12) % 2 === 0;
      row.set(sky ? [120, 170, 220] : stripe ? [70, 140, 60] : [95, 160, 75], 1 + x * 3);
    }
    rows.push(row);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(Buffer.concat(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}
