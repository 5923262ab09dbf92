import { useEffect, useRef, useState } from 'react';

/**
 * `value` once typing pauses for `ms` milliseconds, and at least every `maxWait` milliseconds
 * while it goes on, so a live result never lags far behind a person who keeps typing (a plain
 * trailing debounce waits for the pause however long the typing lasts). The first change after a
 * quiet spell longer than `maxWait` comes through at once.
 */
export function useDebounced<T>(value: T, ms = 250, maxWait = 3 * ms): T {
  const [settled, setSettled] = useState(value);
  const lastEmit = useRef(Date.now());
  useEffect(() => {
    const wait = Math.max(0, Math.min(ms, maxWait - (Date.now() - lastEmit.current)));
    const id = setTimeout(() => {
      lastEmit.current = Date.now();
      setSettled(value);
    }, wait);
    return () => clearTimeout(id);
  }, [value, ms, maxWait]);
  return settled;
}
