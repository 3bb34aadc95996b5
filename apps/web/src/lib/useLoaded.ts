import { useEffect, useState } from 'react';

export interface Loaded<T> {
  /** Left out while loading, and while `key` is null. */
  data: T | undefined;
  error: Error | null;
  retry: () => void;
}

/**
 * One read for a page without the query cache (the cab form): loaded when `key` is set or changes, the
 * answer for an older key dropped. The service worker keeps the cab's reads, so this also answers offline.
 */
export function useLoaded<T>(key: string | null, load: (signal: AbortSignal) => Promise<T>): Loaded<T> {
  const [state, setState] = useState<{ key: string | null; data?: T; error: Error | null }>({ key: null, error: null });
  const [attempt, setAttempt] = useState(0);

  useEffect(() => {
    if (key === null) return;
    const aborted = new AbortController();
    load(aborted.signal).then(
      (data) => {
        if (!aborted.signal.aborted) setState({ key, data, error: null });
      },
      (error: unknown) => {
        if (!aborted.signal.aborted) setState({ key, error: error instanceof Error ? error : new Error(String(error)) });
      },
    );
    return () => aborted.abort();
    // `load` is the same read for the same key.
  }, [key, attempt]);

  const current = key !== null && state.key === key;
  return {
    data: current ? state.data : undefined,
    error: current ? state.error : null,
    retry: () => {
      setState({ key: null, error: null });
      setAttempt((n) => n + 1);
    },
  };
}
