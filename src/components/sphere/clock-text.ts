import { useEffect } from 'react';
import type { Clock } from './store';

/**
 * Runs `write` (which sets DOM text through refs) now and whenever `clock` changes: at once when time is set
 * by hand, at most ~8 times a second while it plays (repainting DOM text every frame is costly on a software
 * rasteriser, and the eye cannot read faster anyway). `deps` as for useEffect.
 */
export function useClockText(clock: Clock, write: () => void, deps: unknown[]): void {
  useEffect(() => {
    write();
    let last = 0;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const unsub = clock.subscribe(() => {
      const now = performance.now();
      if (!clock.playing || now - last > 125) {
        last = now;
        write();
      } else if (!timer) {
        timer = setTimeout(() => {
          timer = null;
          last = performance.now();
          write();
        }, 130);
      }
    });
    return () => {
      unsub();
      if (timer) clearTimeout(timer);
    };
  }, deps);
}
