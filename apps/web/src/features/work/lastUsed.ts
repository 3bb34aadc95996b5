// The cab form offers the rig used last time first. Only machine ids are kept on the phone:
// nothing secret, and nothing another person signing in on the same phone could not see anyway.

export interface LastUsedRig {
  powerMachineId: string | null;
  implementMachineId: string | null;
}

type KeyValueStore = Pick<Storage, 'getItem' | 'setItem'>;

const keyFor = (userId: string) => `hitchbook.cab.last-rig.${userId}`;

const NONE: LastUsedRig = { powerMachineId: null, implementMachineId: null };

const idOrNull = (value: unknown) => (typeof value === 'string' && value.length > 0 && value.length <= 64 ? value : null);

export function readLastUsed(store: KeyValueStore | undefined, userId: string): LastUsedRig {
  try {
    const raw = store?.getItem(keyFor(userId));
    if (!raw) return NONE;
    const parsed = JSON.parse(raw) as Record<string, unknown>;
    return { powerMachineId: idOrNull(parsed.powerMachineId), implementMachineId: idOrNull(parsed.implementMachineId) };
  } catch {
    // A private window or a hand-edited value: the form just starts without a suggestion.
    return NONE;
  }
}

export function rememberLastUsed(store: KeyValueStore | undefined, userId: string, rig: LastUsedRig): void {
  try {
    store?.setItem(keyFor(userId), JSON.stringify({ powerMachineId: rig.powerMachineId, implementMachineId: rig.implementMachineId }));
  } catch {
    // Storage full or refused: remembering the rig is a convenience, never a reason to fail a save.
  }
}

/** The browser's storage, or nothing where there is none (or it is switched off). */
export function browserStore(): KeyValueStore | undefined {
  try {
    return globalThis.localStorage;
  } catch {
    return undefined;
  }
}
