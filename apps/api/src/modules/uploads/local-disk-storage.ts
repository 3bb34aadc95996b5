import { createReadStream } from 'node:fs';
import { mkdir, rm, writeFile } from 'node:fs/promises';
import { isAbsolute, join, relative, resolve } from 'node:path';
import type { Readable } from 'node:stream';
import type { UploadStorage } from './upload-storage.js';

/** 32 random bytes in hex: the only shape a storage key may have, so no key can climb out of the folder. */
const KEY = /^[0-9a-f]{64}$/;

export function isInside(dir: string, parent: string): boolean {
  const rel = relative(resolve(parent), resolve(dir));
  return rel === '' || (!rel.startsWith('..') && !isAbsolute(rel));
}

/**
 * Files on local disk under UPLOAD_DIR, one sub-folder per first key byte, readable by the server
 * process only. Refuses to start inside a folder the server serves, so a stored file can never be
 * fetched (or executed) by URL.
 */
export class LocalDiskStorage implements UploadStorage {
  readonly root: string;

  constructor(root: string, servedDirs: readonly string[]) {
    this.root = resolve(root);
    for (const served of servedDirs) {
      if (isInside(this.root, served) || isInside(served, this.root)) {
        throw new Error(`UPLOAD_DIR (${this.root}) must lie outside the served folder ${served}.`);
      }
    }
  }

  pathFor(key: string): string {
    if (!KEY.test(key)) throw new Error('malformed storage key');
    return join(this.root, key.slice(0, 2), key);
  }

  async put(key: string, data: Buffer): Promise<void> {
    const path = this.pathFor(key);
    await mkdir(join(this.root, key.slice(0, 2)), { recursive: true, mode: 0o700 });
    // 'wx' never overwrites: a key collision fails loudly instead of replacing someone's receipt.
    await writeFile(path, data, { flag: 'wx', mode: 0o600 });
  }

  open(key: string): Promise<Readable> {
    const stream = createReadStream(this.pathFor(key));
    return new Promise((resolveOpen, reject) => {
      stream.once('open', () => resolveOpen(stream));
      stream.once('error', reject);
    });
  }

  async remove(key: string): Promise<void> {
    await rm(this.pathFor(key), { force: true });
  }
}
