import { useCallback, useRef, useState } from 'react';

const PREFIX = 'rivalplate.draft.';

/**
 * Form state that survives the tab closing or the phone sleeping before the person saves:
 * every change is written to localStorage at once (synchronously, so nothing is pending when
 * the page goes), and read back when the form opens again. `clear` forgets it (after a save)
 * and goes back to the initial value.
 */
export function useDraft<T>(
  key: string,
  initial: () => T,
): [T, (next: T | ((prev: T) => T)) => void, () => void] {
  const storageKey = PREFIX + key;
  const [value, setValue] = useState<T>(() => {
    const saved = localStorage.getItem(storageKey);
    if (saved !== null) {
      try {
        return JSON.parse(saved) as T;
      } catch {
        localStorage.removeItem(storageKey);
      }
    }
    return initial();
  });
  const update = useCallback(
    (next: T | ((prev: T) => T)) =>
      setValue((prev) => {
        const v = typeof next === 'function' ? (next as (p: T) => T)(prev) : next;
        localStorage.setItem(storageKey, JSON.stringify(v));
        return v;
      }),
    [storageKey],
  );
  const first = useRef(initial);
  const clear = useCallback(() => {
    localStorage.removeItem(storageKey);
    setValue(first.current());
  }, [storageKey]);
  return [value, update, clear];
}
