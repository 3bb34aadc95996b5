import { useSyncExternalStore } from 'react';
import { isApiError } from './api';

/**
 * Remembers whether the last server answer said the database is unreachable (503), so the
 * layout can show one calm notice instead of every panel failing on its own.
 */
let databaseDown = false;
const listeners = new Set<() => void>();

function set(value: boolean) {
  if (databaseDown === value) return;
  databaseDown = value;
  for (const listener of listeners) listener();
}

export function noteServerError(error: unknown): void {
  if (isApiError(error) && error.status === 503) set(true);
}

export function noteServerSuccess(): void {
  set(false);
}

export function isDatabaseDown(): boolean {
  return databaseDown;
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export function useDatabaseDown(): boolean {
  return useSyncExternalStore(subscribe, isDatabaseDown);
}
