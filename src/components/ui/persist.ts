/**
 * Small UI choices remembered per browser (panel open/closed, drawer, red night mode) in localStorage.
 * Storage can be missing or full (private windows, embedded frames): then the choice lasts the page's life.
 */
import { useCallback, useEffect, useState } from 'react';

const PREFIX = 'armilla.ui.';

export function readPref<T>(key: string, fallback: T): T {
  try {
    const raw = localStorage.getItem(PREFIX + key);
    if (raw === null) return fallback;
    const v = JSON.parse(raw) as unknown;
    return typeof v === typeof fallback ? (v as T) : fallback;
  } catch {
    return fallback;
  }
}

export function writePref<T>(key: string, value: T): void {
  try {
    localStorage.setItem(PREFIX + key, JSON.stringify(value));
  } catch {
    /* storage unavailable: keep the choice in memory only */
  }
}

/** useState whose value is remembered in this browser under `key` (same-typed JSON). */
export function usePref<T>(key: string, fallback: T): [T, (v: T | ((old: T) => T)) => void] {
  const [value, setValue] = useState<T>(() => readPref(key, fallback));
  useEffect(() => {
    const onStorage = (e: StorageEvent) => {
      if (e.key === PREFIX + key) setValue(readPref(key, fallback));
    };
    window.addEventListener('storage', onStorage);
    return () => window.removeEventListener('storage', onStorage);
  }, [key]);
  const set = useCallback(
    (v: T | ((old: T) => T)) =>
      setValue((old) => {
        const next = typeof v === 'function' ? (v as (o: T) => T)(old) : v;
        writePref(key, next);
        return next;
      }),
    [key],
  );
  return [value, set];
}
