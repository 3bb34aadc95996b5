import { useEffect, useState } from 'react';

/**
 * False on the first render, true right after the page has been drawn: for code a page needs soon but
 * not to show itself (a menu's dropdown, the toast host), so that it does not delay the first paint.
 */
export function useAfterFirstPaint(): boolean {
  const [painted, setPainted] = useState(false);
  useEffect(() => {
    // Effects run once the browser has painted; the timer lets that paint finish first.
    const timer = setTimeout(() => setPainted(true), 0);
    return () => clearTimeout(timer);
  }, []);
  return painted;
}
