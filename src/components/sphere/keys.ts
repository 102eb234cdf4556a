/**
 * Armilla's keyboard scheme for the sky view, as data: the handler and the on-screen help (`?`) read the
 * same module, and a unit test checks that every key the help lists does something. Time steps use the unit's initial letter
 * (M minute, H hour, D day, S sidereal day); Shift steps backwards.
 */
export type KeyAction =
  | { kind: 'look'; dAz: number; dAlt: number }
  | { kind: 'zoom'; factor: number }
  | { kind: 'step'; ms: number }
  | { kind: 'toggleView' }
  | { kind: 'play' }
  | { kind: 'now' }
  | { kind: 'nextEvent' }
  | { kind: 'clearSelection' }
  | { kind: 'help' };

import { SIDEREAL_DAY_MS } from './clock';

export const MINUTE_MS = 60_000;
export const HOUR_MS = 3_600_000;
export const DAY_MS = 86_400_000;

/** One row of the help: the keys as shown, and what they do. */
export interface KeyHelpRow {
  keys: string[];
  does: string;
}

export const KEY_HELP: { group: string; rows: KeyHelpRow[] }[] = [
  {
    group: 'Look around',
    rows: [
      { keys: ['←', '→', '↑', '↓'], does: 'Turn the view 5° (with Shift 15°)' },
      { keys: ['+', '−'], does: 'Zoom in and out' },
      { keys: ['V'], does: 'Switch between Observer view and Sphere view' },
      { keys: ['Esc'], does: 'Close the object card' },
    ],
  },
  {
    group: 'Time',
    rows: [
      { keys: ['M', 'Shift M'], does: 'One minute later / earlier' },
      { keys: ['H', 'Shift H'], does: 'One hour later / earlier' },
      { keys: ['D', 'Shift D'], does: 'One day later / earlier' },
      { keys: ['S', 'Shift S'], does: 'One sidereal day later / earlier (the stars return to the same place)' },
      { keys: ['E'], does: 'Jump to the next event (twilight, sunrise, sunset; rise, transit or set of the selected object)' },
      { keys: ['Space', 'P'], does: 'Play or pause time' },
      { keys: ['N'], does: 'Jump to now' },
    ],
  },
  {
    group: 'Anywhere',
    rows: [
      { keys: ['?'], does: 'Show or hide this list of keys' },
      { keys: ['R'], does: 'Red night mode on or off (keeps your eyes dark-adapted)' },
    ],
  },
];

/** Keys that step time (with Shift: backwards), as the list above says. */
const STEP_KEYS: Partial<Record<string, number>> = { m: MINUTE_MS, h: HOUR_MS, d: DAY_MS, s: SIDEREAL_DAY_MS };

/** The action for a key press on the sky view, or null when the view does not use the key. */
export function keyAction(key: string, shift: boolean): KeyAction | null {
  const back = shift ? -1 : 1;
  // Letters act the same in either case (Shift changes the direction, not the key).
  const k = key.length === 1 ? key.toLowerCase() : key;
  const stepMs = STEP_KEYS[k];
  if (stepMs !== undefined) return { kind: 'step', ms: back * stepMs };
  const d = shift ? 15 : 5;
  switch (k) {
    case 'ArrowLeft':
      return { kind: 'look', dAz: -d, dAlt: 0 };
    case 'ArrowRight':
      return { kind: 'look', dAz: d, dAlt: 0 };
    case 'ArrowUp':
      return { kind: 'look', dAz: 0, dAlt: d };
    case 'ArrowDown':
      return { kind: 'look', dAz: 0, dAlt: -d };
    case '+':
    case '=':
      return { kind: 'zoom', factor: 1 / 1.15 };
    case '-':
    case '_':
      return { kind: 'zoom', factor: 1.15 };
    case 'v':
      return { kind: 'toggleView' };
    case 'e':
      return { kind: 'nextEvent' };
    case ' ':
    case 'p':
      return { kind: 'play' };
    case 'n':
      return { kind: 'now' };
    case 'Escape':
      return { kind: 'clearSelection' };
    case '?':
      return { kind: 'help' };
    default:
      return null;
  }
}
