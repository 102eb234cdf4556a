/**
 * The sky view's keyboard scheme (components/sphere/keys.ts): every key the on-screen help lists does
 * something, the steps are the stated amounts, and the bracket keys are no longer used. The sidereal day
 * is 23 h 56 min 4.0905 s of clock time (common practice).
 */
import { describe, expect, it } from 'vitest';
import { DAY_MS, HOUR_MS, KEY_HELP, keyAction, MINUTE_MS } from '../../../src/components/sphere/keys';

const KEY_OF: Record<string, [string, boolean]> = {
  '←': ['ArrowLeft', false],
  '→': ['ArrowRight', false],
  '↑': ['ArrowUp', false],
  '↓': ['ArrowDown', false],
  '+': ['+', true],
  '−': ['-', false],
  Esc: ['Escape', false],
  Space: [' ', false],
  '?': ['?', true],
};

function press(label: string): ReturnType<typeof keyAction> {
  if (KEY_OF[label]) return keyAction(...KEY_OF[label]);
  const shift = label.startsWith('Shift ');
  const k = shift ? label.slice(6) : label;
  return keyAction(shift ? k.toUpperCase() : k.toLowerCase(), shift);
}

describe('sky view keys', () => {
  it('every key in the help does something in the view (R is answered page-wide by the layout)', () => {
    const listed = KEY_HELP.flatMap((g) => g.rows.flatMap((r) => r.keys));
    expect(listed.length).toBeGreaterThan(15);
    for (const k of listed) {
      if (k === 'R') continue;
      expect(press(k), k).not.toBeNull();
    }
  });

  it('time steps: M minute, H hour, D day, S sidereal day; Shift goes back', () => {
    expect(keyAction('m', false)).toEqual({ kind: 'step', ms: MINUTE_MS });
    expect(keyAction('H', true)).toEqual({ kind: 'step', ms: -HOUR_MS });
    expect(keyAction('h', false)).toEqual({ kind: 'step', ms: 3_600_000 });
    expect(keyAction('d', false)).toEqual({ kind: 'step', ms: 86_400_000 });
    expect(DAY_MS).toBe(86_400_000);
    const s = keyAction('s', false);
    expect(s?.kind === 'step' && s.ms).toBe((23 * 3600 + 56 * 60 + 4.0905) * 1000);
    expect(keyAction('S', true)).toEqual({ kind: 'step', ms: -(23 * 3600 + 56 * 60 + 4.0905) * 1000 });
  });

  it('the bracket keys are not part of the scheme', () => {
    expect(keyAction('[', false)).toBeNull();
    expect(keyAction(']', false)).toBeNull();
    expect(keyAction('{', true)).toBeNull();
    expect(keyAction('}', true)).toBeNull();
  });
});
