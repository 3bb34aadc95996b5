import { lazy, type ComponentType } from 'react';

/** A route module exports its page as `Component`; each becomes a chunk of its own, fetched on first visit. */
export function page(load: () => Promise<{ Component: ComponentType }>) {
  return lazy(() => load().then((module) => ({ default: module.Component })));
}
