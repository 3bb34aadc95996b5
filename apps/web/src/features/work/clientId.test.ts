import { webcrypto } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { uuidSchema } from '@hitchbook/shared/schemas/common';
import { newClientId } from './clientId';

describe('client ids', () => {
  it('are version-4 ids the server accepts, with or without randomUUID', () => {
    const withoutRandomUuid = { getRandomValues: webcrypto.getRandomValues.bind(webcrypto) } as Pick<Crypto, 'getRandomValues'>;
    for (const id of [newClientId(), newClientId(withoutRandomUuid)]) {
      expect(uuidSchema.safeParse(id).success).toBe(true);
      expect(id[14]).toBe('4');
    }
  });

  it('differ from one entry to the next', () => {
    const withoutRandomUuid = { getRandomValues: webcrypto.getRandomValues.bind(webcrypto) } as Pick<Crypto, 'getRandomValues'>;
    expect(newClientId(withoutRandomUuid)).not.toBe(newClientId(withoutRandomUuid));
  });
});
