/**
 * Label thinning on the overlay: names never overlap, higher-priority names win, markers stay.
 * Pure geometry on screen boxes; widths are given (no canvas).
 */
import { describe, expect, it } from 'vitest';
import { declutter, labelBox, LABEL_PRIORITY, type LabelItem, type PlacedLabel } from '../../../src/components/sphere/overlay';

const item = (kind: LabelItem['kind'], text: string, marker: LabelItem['marker'] = 'none'): LabelItem => ({ kind, text, x: 0, y: 0, z: -100, color: '#fff', marker });
const at = (it: LabelItem, sx: number, sy: number, far = false): PlacedLabel => ({ item: it, sx, sy, far, text: true });
const measure = (it: LabelItem) => it.text.length * 7; // 7 px per character

const overlaps = (a: number[], b: number[]) => a[0] < b[2] && a[2] > b[0] && a[1] < b[3] && a[3] > b[1];

describe('declutter', () => {
  it('keeps the higher-priority name where two overlap, and the marker of the loser', () => {
    const star = at(item('star', 'Pollux'), 100, 100);
    const target = at(item('target', 'Field A', 'ring'), 98, 101);
    const out = declutter([star, target], measure);
    expect(out[0].item.kind).toBe('target'); // drawn first
    expect(target.text).toBe(true);
    expect(star.text).toBe(false);
    const lonely = at(item('grid', '30°'), 400, 300);
    declutter([lonely], measure);
    expect(lonely.text).toBe(true);
  });

  it('writes no two names that overlap, in any crowd', () => {
    // A deterministic crowd: 300 labels of every kind on a 600 × 400 area.
    const kinds = Object.keys(LABEL_PRIORITY) as LabelItem['kind'][];
    let seed = 7;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const crowd = Array.from({ length: 300 }, (_, i) => at(item(kinds[i % kinds.length], `L${i}`.padEnd(2 + (i % 9), 'x'), i % 3 ? 'none' : 'dot'), rnd() * 600, rnd() * 400, i % 5 === 0));
    declutter(crowd, measure);
    const boxes = crowd.filter((p) => p.text).map((p) => labelBox(p.item, p.sx, p.sy, measure(p.item)));
    expect(boxes.length).toBeGreaterThan(30);
    expect(boxes.length).toBeLessThan(300);
    for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) expect(overlaps(boxes[i], boxes[j])).toBe(false);
  });

  it('places the near side of the sphere before the far side, and a selected target first', () => {
    const far = at(item('body', 'Saturn'), 100, 100, true);
    const near = at(item('star', 'Spica'), 102, 100, false);
    declutter([far, near], measure);
    expect(near.text).toBe(true);
    expect(far.text).toBe(false);
    const plain = at(item('target', 'Field B', 'ring'), 100, 100);
    const chosen = at({ ...item('target', 'Field C', 'ring'), bold: true }, 100, 100);
    declutter([plain, chosen], measure);
    expect(chosen.text).toBe(true);
    expect(plain.text).toBe(false);
  });
});
