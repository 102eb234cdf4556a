/**
 * Label thinning on the overlay: names never overlap, higher-priority names win, markers stay.
 * Pure geometry on screen boxes; widths are given (no canvas).
 */
import { describe, expect, it } from 'vitest';
import { declutter, labelBox, LABEL_GAP, LABEL_PRIORITY, type LabelItem, type PlacedLabel } from '../../../src/components/sphere/overlay';

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

  it('on a crowded ecliptic: no two written names touch, the higher-priority name wins, every marker stays', () => {
    // A Moon beside the September equinox point, planets, bright stars and grid numbers strung along a
    // line (the ecliptic seen edge-on), at three zoom levels: positions spread out by the zoom factor.
    const along = [
      item('ref', 'September equinox', 'cross'),
      item('body', 'Moon 36%'),
      item('body', 'Mars'),
      item('star', 'Spica'),
      item('grid', 'λ180°'),
      item('target', 'Field 7', 'ring'),
      item('star', 'Porrima'),
      item('pin', 'Slew start', 'dot'),
      item('comment', '#2', 'comment'),
      item('grid', '12h'),
      item('ref', 'Ecliptic pole', 'cross'),
      item('star', 'Arcturus'),
    ];
    for (const zoom of [0.5, 1, 3]) {
      const crowd = along.map((it, i) => at({ ...it }, 300 + (i - 6) * 9 * zoom, 200 + ((i * 5) % 7) * zoom));
      const out = declutter(crowd, measure);
      expect(out).toHaveLength(along.length); // markers of every label are still handed to the drawing
      const written = crowd.filter((p) => p.text);
      const boxes = written.map((p) => labelBox(p.item, p.sx, p.sy, measure(p.item)));
      for (let i = 0; i < boxes.length; i++)
        for (let j = i + 1; j < boxes.length; j++) {
          const a = boxes[i]!, b = boxes[j]!;
          const apart = a[2] + LABEL_GAP <= b[0] || b[2] + LABEL_GAP <= a[0] || a[3] + LABEL_GAP <= b[1] || b[3] + LABEL_GAP <= a[1];
          expect(apart, `${written[i]!.item.text} / ${written[j]!.item.text} at zoom ${zoom}`).toBe(true);
        }
      // The target (priority 1) is always written; a name is left out only for a name of the same or
      // higher priority (or that one's marker) in its way.
      expect(crowd[5]!.text).toBe(true);
      const near = (a: number[], b: number[]) => a[0] - LABEL_GAP < b[2] && a[2] + LABEL_GAP > b[0] && a[1] - LABEL_GAP < b[3] && a[3] + LABEL_GAP > b[1];
      for (const p of crowd.filter((q) => !q.text)) {
        const box = labelBox(p.item, p.sx, p.sy, measure(p.item));
        const blocker = crowd.find(
          (q) => q !== p && LABEL_PRIORITY[q.item.kind] <= LABEL_PRIORITY[p.item.kind] && ((q.text && near(box, labelBox(q.item, q.sx, q.sy, measure(q.item)))) || (q.item.marker !== 'none' && near(box, [q.sx - 9, q.sy - 17, q.sx + 16, q.sy + 9]))),
        );
        expect(blocker, `${p.item.text} left out at zoom ${zoom}`).toBeDefined();
      }
    }
    // The pair the sky view showed: "September equinox" on top of "Moon 36%". The Moon's name wins.
    const eq = at(item('ref', 'September equinox', 'cross'), 300, 200);
    const moon = at(item('body', 'Moon 36%'), 310, 203);
    declutter([eq, moon], measure);
    expect(moon.text).toBe(true);
    expect(eq.text).toBe(false);
  });

  it('does not write a lower-priority name over the ring of a target', () => {
    const target = at(item('target', 'T', 'ring'), 200, 200);
    const star = at(item('star', 'Vega'), 180, 201); // its name would start inside the ring
    declutter([star, target], measure);
    expect(target.text).toBe(true);
    expect(star.text).toBe(false);
    const farStar = at(item('star', 'Vega'), 120, 201);
    declutter([farStar, at(item('target', 'T', 'ring'), 200, 200)], measure);
    expect(farStar.text).toBe(true);
  });
});
