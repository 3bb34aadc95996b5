import bcrypt from 'bcrypt';

let dummyHash: Promise<string> | null = null;

/**
 * Compares against a fixed dummy hash when there is no user, so "no such e-mail" and
 * "wrong password" take the same time.
 */
export async function verifyPassword(password: string, hash: string | null | undefined, cost: number): Promise<boolean> {
  if (new TextEncoder().encode(password).length > 72) {
    // bcrypt would silently compare only the first 72 bytes; such a password can never be ours.
    await bcrypt.compare('x', hash ?? (await (dummyHash ??= bcrypt.hash('no-such-user', cost))));
    return false;
  }
  if (!hash) {
    await bcrypt.compare(password, await (dummyHash ??= bcrypt.hash('no-such-user', cost)));
    return false;
  }
  return bcrypt.compare(password, hash);
}

export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}
