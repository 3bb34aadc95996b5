import { describe, expect, it } from 'vitest';
import { readLastUsed, rememberLastUsed } from './lastUsed';

function memoryStore() {
  const data = new Map<string, string>();
  return { getItem: (k: string) => data.get(k) ?? null, setItem: (k: string, v: string) => void data.set(k, v), data };
}

describe('last used rig', () => {
  it('gives back the rig a person used last', () => {
    const store = memoryStore();
    rememberLastUsed(store, 'rudy', { powerMachineId: 'tractor-65', implementMachineId: 'cutter-7' });
    expect(readLastUsed(store, 'rudy')).toEqual({ powerMachineId: 'tractor-65', implementMachineId: 'cutter-7' });
  });

  it('keeps one person’s rig apart from another’s on a shared phone', () => {
    const store = memoryStore();
    rememberLastUsed(store, 'rudy', { powerMachineId: 'tractor-65', implementMachineId: null });
    expect(readLastUsed(store, 'arvid')).toEqual({ powerMachineId: null, implementMachineId: null });
  });

  it('stores machine ids and nothing else', () => {
    const store = memoryStore();
    rememberLastUsed(store, 'rudy', { powerMachineId: 'tractor-65', implementMachineId: null, token: 'secret' } as never);
    expect([...store.data.values()]).toEqual(['{"powerMachineId":"tractor-65","implementMachineId":null}']);
  });

  it('starts without a suggestion when the stored value is unreadable or storage is missing', () => {
    const store = memoryStore();
    store.setItem('hitchbook.cab.last-rig.rudy', '{not json');
    expect(readLastUsed(store, 'rudy').powerMachineId).toBeNull();
    expect(readLastUsed(undefined, 'rudy').powerMachineId).toBeNull();
    expect(() => rememberLastUsed(undefined, 'rudy', { powerMachineId: 'x', implementMachineId: null })).not.toThrow();
  });
});
