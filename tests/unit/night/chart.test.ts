/** Night chart data preparation (src/lib/night/chart.ts). */
import { describe, expect, it } from 'vitest';
import { airmassTicks, altitudeAt, altitudeForAirmass, azAltAt, curveRuns, daylightBands, figureRows, hourTicks, limitBands, moonPhaseName, nightSummary, polarXY, smallCircle, sortRows, trackRuns } from '../../../src/lib/night/chart';

const T = (hhmm: string, day = 20) => `2026-03-${day}T${hhmm}:00Z`;
const ms = (s: string) => Date.parse(s);

describe('curveRuns', () => {
  const samples = [0, 1, 2, 3, 4, 5, 6].map((h) => ({ time: T(`1${h}:00`), altitude: 10 * h }));
  it('splits at the window edges, which belong to both neighbouring runs, altitude interpolated', () => {
    const runs = curveRuns(samples, [{ start: T('12:30'), end: T('14:15') }]);
    expect(runs.map((r) => r.inside)).toEqual([false, true, false]);
    expect(runs[0].points.at(-1)).toEqual({ t: ms(T('12:30')), alt: 25 });
    expect(runs[1].points[0]).toEqual({ t: ms(T('12:30')), alt: 25 });
    expect(runs[1].points.at(-1)).toEqual({ t: ms(T('14:15')), alt: 42.5 });
    expect(runs[2].points[0]).toEqual(runs[1].points.at(-1));
    expect(runs[2].points.at(-1)!.t).toBe(ms(T('16:00')));
  });
  it('no window: one outside run; a window over everything: one inside run', () => {
    expect(curveRuns(samples, []).map((r) => [r.inside, r.points.length])).toEqual([[false, 7]]);
    expect(curveRuns(samples, [{ start: T('09:00'), end: T('20:00') }]).map((r) => [r.inside, r.points.length])).toEqual([[true, 7]]);
  });
  it('altitudeAt interpolates linearly and clamps', () => {
    expect(altitudeAt(samples, ms(T('13:06')))).toBeCloseTo(31, 9);
    expect(altitudeAt(samples, ms(T('08:00')))).toBe(0);
    expect(altitudeAt(samples, ms(T('23:00')))).toBe(60);
  });
});

describe('daylightBands', () => {
  const events = [
    { kind: 'set', time: T('18:26') }, { kind: 'civil-dusk', time: T('18:52') }, { kind: 'nautical-dusk', time: T('19:22') },
    { kind: 'astronomical-dusk', time: T('19:53') }, { kind: 'transit', time: T('00:10', 21) }, { kind: 'astronomical-dawn', time: T('04:49', 21) },
    { kind: 'nautical-dawn', time: T('05:20', 21) }, { kind: 'civil-dawn', time: T('05:50', 21) }, { kind: 'rise', time: T('06:16', 21) },
  ];
  it('follows the Sun events, day before sunset and after sunrise', () => {
    const b = daylightBands(events, ms(T('18:00')), ms(T('07:00', 21)), 'night');
    expect(b.map((x) => x.key)).toEqual(['day', 'civil', 'nautical', 'astronomical', 'night', 'astronomical', 'nautical', 'civil', 'day']);
    expect(b[4]).toEqual({ key: 'night', start: ms(T('19:53')), end: ms(T('04:49', 21)) });
    for (let i = 1; i < b.length; i++) expect(b[i].start).toBe(b[i - 1].end);
  });
  it('a span starting inside nautical twilight starts nautical; no events → the fallback', () => {
    expect(daylightBands(events, ms(T('19:00')), ms(T('21:00')), 'day').map((x) => x.key)).toEqual(['nautical', 'astronomical', 'night']);
    expect(daylightBands([], 0, 1000, 'night')).toEqual([{ key: 'night', start: 0, end: 1000 }]);
  });
});

describe('limits and airmass', () => {
  it('limit bands for floor, ceiling and keyhole', () => {
    expect(limitBands({ minAltitude: 20, maxAltitude: 85, keyholeRadius: 3 }).map((b) => [b.limit, b.low, b.high])).toEqual([
      ['minAltitude', 0, 20], ['maxAltitude', 85, 90], ['keyholeRadius', 87, 90],
    ]);
    expect(limitBands(null)).toEqual([]);
    expect(limitBands({ minAltitude: -5 })).toEqual([]);
  });
  it('airmass 2 sits at 29.90497° (Kasten & Young 1989 inverted by bisection with /usr/bin/python3)', () => {
    expect(altitudeForAirmass(2)).toBeCloseTo(29.90497, 4);
    const ticks = airmassTicks([1, 1.5, 3]);
    expect(ticks[0].altitude).toBe(90);
    expect(ticks[1].altitude).toBeGreaterThan(ticks[2].altitude);
  });
});

describe('time axis', () => {
  it('ticks on whole local hours (Europe/Madrid is UTC+1 on 2026-03-20, common practice: CET until the last Sunday of March)', () => {
    const t = hourTicks(ms(T('18:26')), ms(T('22:10')), 'Europe/Madrid');
    expect(t.map((x) => new Date(x).toISOString().slice(11, 16))).toEqual(['19:00', '20:00', '21:00', '22:00']);
    const k = hourTicks(ms(T('18:26')), ms(T('22:10')), 'Asia/Kolkata', 2); // UTC+5:30 (common practice)
    expect(k.map((x) => new Date(x).toISOString().slice(11, 16))).toEqual(['18:30', '20:30']);
  });
});

describe('words and table', () => {
  const night = {
    from: T('18:26'), to: T('06:17', 21),
    sun: { events: [{ kind: 'set', time: T('18:26') }, { kind: 'astronomical-dusk', time: T('19:53') }, { kind: 'astronomical-dawn', time: T('04:49', 21) }, { kind: 'rise', time: T('06:16', 21) }] },
    moon: { illumination: 0.05, phase: 25 },
    targets: [
      { name: 'B field', windows: [{ start: T('20:00'), end: T('23:00'), closedBy: 'minAltitude' }], best: { time: T('21:00'), altitude: 60, airmass: 1.15, moonSeparation: 50, sunSeparation: 120, inWindow: true } },
      { name: 'A field', windows: [], reasons: ['minAltitude'], best: { time: T('18:26'), altitude: 5, airmass: 9, moonSeparation: 30, sunSeparation: 40, inWindow: false } },
      { name: 'C field', windows: [{ start: T('19:00'), end: T('21:00'), closedBy: 'horizonMask' }], best: { time: T('19:00'), altitude: 70, airmass: 1.06, moonSeparation: 10, sunSeparation: 90, inWindow: true } },
    ],
  };
  it('the text alternative names the night, the Moon and each target, in the site zone', () => {
    const s = nightSummary(night, 'UTC');
    expect(s).toContain('Sunset 18:26.');
    expect(s).toContain('Astronomical night 19:53 to 04:49.');
    expect(s).toContain('Moon 5 % lit (waxing crescent).');
    expect(s).toContain('B field: inside the limits 20:00–23:00 (closed by the altitude floor); highest 60° at 21:00, airmass 1.15.');
    expect(s).toContain('A field: never inside the limits (kept out by the altitude floor).');
    expect(nightSummary(night, 'Europe/Madrid')).toContain('Sunset 19:26.');
  });
  it('moon phase names (0 new, 90 first quarter, 180 full, 270 last quarter: common practice)', () => {
    expect([0, 90, 180, 270, 350].map(moonPhaseName)).toEqual(['new moon', 'first quarter', 'full moon', 'last quarter', 'new moon']);
  });
  it('rows sort by any column, targets without a window last', () => {
    const rows = figureRows(night);
    expect(sortRows(rows, 'name', 'asc').map((r) => r.name)).toEqual(['A field', 'B field', 'C field']);
    expect(sortRows(rows, 'window', 'asc').map((r) => r.name)).toEqual(['C field', 'B field', 'A field']);
    expect(sortRows(rows, 'altitude', 'desc').map((r) => r.name)).toEqual(['C field', 'B field', 'A field']);
    expect(sortRows(rows, 'airmass', 'asc').map((r) => r.name)).toEqual(['C field', 'B field', 'A field']);
    expect(sortRows(rows, 'moon', 'asc').map((r) => r.name)).toEqual(['C field', 'B field', 'A field']);
    expect(rows[0].windowMin).toBe(180);
  });
});

describe('sky coverage helpers', () => {
  it('polar projection: zenith at the centre, north up, east right, horizon at R', () => {
    const [x0, y0] = polarXY(123, 90, 100, 100, 80);
    expect([x0, y0]).toEqual([100, 100]);
    const n = polarXY(0, 0, 100, 100, 80), e = polarXY(90, 0, 100, 100, 80);
    expect(n[0]).toBeCloseTo(100, 9); expect(n[1]).toBeCloseTo(20, 9);
    expect(e[0]).toBeCloseTo(180, 9); expect(e[1]).toBeCloseTo(100, 9);
  });
  it('a small circle keeps its angular radius (spherical law of cosines, common practice)', () => {
    const D = Math.PI / 180;
    for (const p of smallCircle(200, 35, 30, 30)) {
      const c = Math.sin(35 * D) * Math.sin(p.alt * D) + Math.cos(35 * D) * Math.cos(p.alt * D) * Math.cos((p.az - 200) * D);
      expect(Math.acos(c) / D).toBeCloseTo(30, 9);
    }
  });
  it('track runs drop the parts below the horizon and split at windows; azimuth interpolates across north', () => {
    const s = [[-5, 80], [5, 90], [15, 100], [25, 110], [-2, 120]].map(([alt, az], i) => ({ time: T(`1${i}:00`), altitude: alt, azimuth: az }));
    const runs = trackRuns(s, [{ start: T('11:00'), end: T('12:00') }]);
    expect(runs.map((r) => [r.inside, r.points.length])).toEqual([[false, 2], [true, 2], [false, 3]]);
    expect(runs[0].points[0].alt).toBe(0);
    const wrap = azAltAt([{ time: T('20:00'), altitude: 10, azimuth: 350 }, { time: T('21:00'), altitude: 20, azimuth: 10 }], ms(T('20:30')))!;
    expect(wrap.az).toBeCloseTo(0, 9);
    expect(wrap.alt).toBeCloseTo(15, 9);
  });
});
