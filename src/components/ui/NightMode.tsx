/**
 * Red night mode: the whole page (sky, panels, presenter, charts) drawn in dim reds only, to keep the eyes
 * dark-adapted at the telescope. The page layout applies it before the first paint and answers the R key
 * (see layouts/AppLayout.astro and styles/global.css); this button is the same switch for islands.
 */
import { useEffect, useState } from 'react';

export const NIGHT_KEY = 'armilla.ui.nightRed';
export const NIGHT_EVENT = 'armilla:night';

export function nightRedOn(): boolean {
  return typeof document !== 'undefined' && document.documentElement.dataset.night === 'red';
}

/** Turns red night mode on or off and remembers the choice in this browser. */
export function setNightRed(on: boolean): void {
  const root = document.documentElement;
  if (on) root.dataset.night = 'red';
  else delete root.dataset.night;
  try {
    localStorage.setItem(NIGHT_KEY, on ? '1' : '0');
  } catch {
    /* storage unavailable: the choice lasts this page */
  }
  document.dispatchEvent(new CustomEvent(NIGHT_EVENT));
}

export function useNightRed(): boolean {
  const [on, setOn] = useState(nightRedOn);
  useEffect(() => {
    const sync = () => setOn(nightRedOn());
    document.addEventListener(NIGHT_EVENT, sync);
    return () => document.removeEventListener(NIGHT_EVENT, sync);
  }, []);
  return on;
}

export function NightModeButton({ className }: { className: string }) {
  const on = useNightRed();
  return (
    <button type="button" className={className} aria-pressed={on} onClick={() => setNightRed(!on)} title="Red night mode (R)" data-testid="night-mode-toggle">
      Red light
    </button>
  );
}
