import { useEffect, useRef } from 'react';
import type { ZodType } from 'zod';

/**
 * The schema itself, or a loader for it: a page that must show quickly (the cab form) loads zod and its
 * schema right after it is drawn, and a submit before it has arrived waits for it rather than skip the checks.
 */
export type SchemaSource = ZodType | (() => Promise<ZodType>);

export function useSchema(source: SchemaSource) {
  const loaded = useRef<ZodType | null>(typeof source === 'function' ? null : source);
  const loading = useRef<Promise<ZodType> | null>(null);
  const load = () => {
    if (typeof source !== 'function') return Promise.resolve(source);
    loading.current ??= source().then((schema) => (loaded.current = schema));
    return loading.current;
  };
  useEffect(() => {
    void load();
    // The source is fixed for the form's life.
  }, []);
  /**
   * Runs a submit once the schema is here. Should its chunk not load (no signal, no service worker yet), the
   * submit goes ahead all the same: the server checks the request against the same schema either way.
   */
  const whenLoaded = (submit: () => void) => {
    if (loaded.current) submit();
    else void load().then(submit, submit);
  };
  return { loaded, whenLoaded };
}
