import { describe, expect, it } from 'vitest';
import { diffScenes, lineDiff, stableStringify } from '../../../src/lib/client/scene-diff';

describe('diffScenes', () => {
  it('lists only fields whose values differ, ignoring key order', () => {
    const mine = { title: 'A', site: { lat: 1, lon: 2 }, time: 'x' };
    const theirs = { title: 'B', site: { lon: 2, lat: 1 }, time: 'x' };
    expect(diffScenes(mine, theirs).map((d) => d.field)).toEqual(['title']);
  });
});

describe('stableStringify', () => {
  it('sorts keys and drops undefined', () => {
    expect(stableStringify({ b: 1, a: { d: undefined, c: 2 } })).toBe('{"a":{"c":2},"b":1}');
  });
});

describe('lineDiff', () => {
  it('marks lines present on one side only', () => {
    const d = lineDiff('a\nb\nc', 'a\nx\nc');
    expect(d.left.map((l) => l.changed)).toEqual([false, true, false]);
    expect(d.right.map((l) => l.changed)).toEqual([false, true, false]);
  });
});
