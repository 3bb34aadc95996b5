/** The first response given for a key, replayed byte for byte to every later request with that key. */
export interface SavedResponse {
  status: number;
  body: string;
  requestId: string;
}

type Entry = { state: 'in_flight' } | { state: 'saved'; endpoint: string; fingerprint: string; response: SavedResponse };

export type Claim =
  | { kind: 'new' }
  | { kind: 'in_flight' }
  | { kind: 'saved'; endpoint: string; fingerprint: string; response: SavedResponse };

export const MAX_KEY_LENGTH = 255;

/**
 * Idempotency keys as Stripe keeps them: per API key, claimed as soon as a request with the key arrives
 * (a second one meanwhile is refused), and saved only once the endpoint has begun its work, so a request
 * that failed validation can be corrected and sent again under the same key.
 */
export class IdempotencyStore {
  private readonly entries = new Map<string, Entry>();

  claim(scope: string): Claim {
    const entry = this.entries.get(scope);
    if (!entry) {
      this.entries.set(scope, { state: 'in_flight' });
      return { kind: 'new' };
    }
    if (entry.state === 'in_flight') return { kind: 'in_flight' };
    return { kind: 'saved', endpoint: entry.endpoint, fingerprint: entry.fingerprint, response: entry.response };
  }

  save(scope: string, endpoint: string, fingerprint: string, response: SavedResponse): void {
    this.entries.set(scope, { state: 'saved', endpoint, fingerprint, response });
  }

  /** Gives up a claim without saving, after a request that never reached the endpoint's work. */
  release(scope: string): void {
    if (this.entries.get(scope)?.state === 'in_flight') this.entries.delete(scope);
  }

  clear(): void {
    this.entries.clear();
  }
}

/** The same parameters in any order give the same fingerprint; any other value or parameter gives another. */
export function fingerprintOf(formBody: string): string {
  const pairs = [...new URLSearchParams(formBody)].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return JSON.stringify(pairs);
}
