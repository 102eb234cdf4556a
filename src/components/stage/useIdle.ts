/** True once the pointer has rested for `ms` (no move, touch or key); any of those makes it false again. */
import { useEffect, useState } from 'react';

export function useIdle(ms = 2500): boolean {
  const [idle, setIdle] = useState(false);
  useEffect(() => {
    let t: ReturnType<typeof setTimeout> | null = null;
    const wake = () => {
      setIdle(false);
      if (t) clearTimeout(t);
      t = setTimeout(() => setIdle(true), ms);
    };
    wake();
    const evs = ['pointermove', 'pointerdown', 'keydown', 'wheel'] as const;
    for (const e of evs) window.addEventListener(e, wake, { passive: true });
    return () => {
      if (t) clearTimeout(t);
      for (const e of evs) window.removeEventListener(e, wake);
    };
  }, [ms]);
  return idle;
}
