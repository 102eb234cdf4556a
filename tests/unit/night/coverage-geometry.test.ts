/**
 * The sky-coverage chart (src/components/night/CoverageChart.tsx) as drawn, against values from outside
 * the project: the night data of a stated site goes through the chart component (rendered to SVG), and
 * the drawn geometry is read back from the SVG.
 *
 * - Positions: ERFA 2.0 (Debian python3-erfa) through reference/coverage-erfa.py, whose output is
 *   committed as reference/coverage-erfa.json (regenerate: /usr/bin/python3 …/coverage-erfa.py > …json).
 *   Site stated for the test: latitude −30.25°, longitude −70.74°, height 2200 m.
 * - Projection: the chart is a zenithal (azimuthal) equidistant projection centred on the zenith, north
 *   up and east to the right: a point at zenith distance c and azimuth A sits at ρ = R·c/90° from the
 *   centre, at x = cx + ρ sin A, y = cy − ρ cos A (Snyder 1987, Map Projections — A Working Manual, USGS
 *   Professional Paper 1395, §25 azimuthal equidistant, with the sky seen from below flipped to "east
 *   right" as the chart's description says). R and the centre are read from the drawn horizon circle.
 * Path coordinates are written to 0.1 px, so a drawn point is within 0.071 px of its exact place.
 */
import { describe, expect, it } from 'vitest';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { CoverageChart } from '../../../src/components/night/CoverageChart';
import { nightData } from '../../../src/lib/sky/night';
import type { Envelope } from '../../../src/lib/sky/envelope';
import erfa from './reference/coverage-erfa.json';

const ms = (s: string) => Date.parse(s);
const D = Math.PI / 180;
const site = { name: 'Coverage test site', lat: erfa.site.lat, lon: erfa.site.lon, height: erfa.site.height, timeZone: 'America/Santiago' };
const ENVELOPE: Envelope = {
  minAltitude: 20, maxAltitude: 80, keyholeRadius: 5, azimuthRanges: [[20, 340]],
  horizonMask: [[150, 10], [180, 35], [210, 10]], sunAvoidance: 40, moonAvoidance: 15,
};

function render(envelope: Envelope) {
  const data = nightData({ site, envelope, targets: [{ name: 'Field S', raDeg: erfa.star.ra, decDeg: erfa.star.dec }], from: ms('2026-06-10T22:00:00Z'), to: ms('2026-06-11T18:00:00Z'), stepMin: 5 });
  return renderToStaticMarkup(createElement(CoverageChart, { data, cursor: ms(erfa.cursor), timeZone: site.timeZone, ink: 'print', size: 320, fixedSize: true }));
}

/** The horizon circle: the first <circle> after the clip path, its centre and radius. */
function rim(svg: string) {
  const body = svg.slice(svg.indexOf('</defs>'));
  const m = /<circle cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"/.exec(body)!;
  return { cx: Number(m[1]), cy: Number(m[2]), R: Number(m[3]) };
}

/** Vertices of the M/L commands of a path's d (arcs are skipped). */
function vertices(d: string): [number, number][] {
  return [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}
const pathD = (svg: string, attr: string) => new RegExp(`<path d="([^"]*)"[^>]*${attr}`).exec(svg)?.[1] ?? new RegExp(`<path[^>]*${attr}[^>]*d="([^"]*)"`).exec(svg)?.[1];

/** Snyder's azimuthal equidistant, zenith-centred, north up, east right. */
function project(az: number, alt: number, c: { cx: number; cy: number; R: number }): [number, number] {
  const rho = (c.R * (90 - alt)) / 90;
  return [c.cx + rho * Math.sin(az * D), c.cy - rho * Math.cos(az * D)];
}
/** Its inverse. */
function unproject(x: number, y: number, c: { cx: number; cy: number; R: number }) {
  const dx = x - c.cx, dy = y - c.cy;
  return { alt: 90 - (90 * Math.hypot(dx, dy)) / c.R, az: ((Math.atan2(dx, -dy) / D) % 360 + 360) % 360 };
}
/** Great-circle distance between two az/alt directions, degrees (spherical law of cosines, common practice). */
function separation(a: { az: number; alt: number }, b: { az: number; alt: number }) {
  const c = Math.sin(a.alt * D) * Math.sin(b.alt * D) + Math.cos(a.alt * D) * Math.cos(b.alt * D) * Math.cos((a.az - b.az) * D);
  return Math.acos(Math.max(-1, Math.min(1, c))) / D;
}

describe('sky-coverage chart geometry', () => {
  const svg = render(ENVELOPE);
  const c = rim(svg);

  it('draws the horizon circle it projects onto (the chart at 320 px)', () => {
    expect(c.R).toBeGreaterThan(100);
    expect(c.cx).toBe(160);
    expect(c.cy).toBe(160);
  });

  it('a target track passes through the az/alt ERFA gives at each sample time, projected (within 0.1 px)', () => {
    const group = /<g data-target="Field S"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1];
    const pts = [...group.matchAll(/<path d="([^"]*)"/g)].flatMap((m) => vertices(m[1]));
    expect(pts.length).toBeGreaterThan(50);
    for (const p of erfa.star.track) {
      const [x, y] = project(p.azimuth, p.altitude, c);
      const nearest = Math.min(...pts.map(([u, v]) => Math.hypot(u - x, v - y)));
      expect(nearest, `${p.time}: az ${p.azimuth.toFixed(4)}°, alt ${p.altitude.toFixed(4)}° (ERFA atco13)`).toBeLessThan(0.1);
    }
  });

  it('the allowed region starts at the floor, rises over the horizon mask and closes outside the azimuth range', () => {
    const d = pathD(svg, 'data-part="forbidden"')!;
    // after the rim circle (arcs), one vertex per degree of azimuth, 0…360
    const profile = vertices(d.slice(d.indexOf('Z') + 1));
    expect(profile.length).toBe(361);
    const radius = (az: number) => Math.hypot(profile[az][0] - c.cx, profile[az][1] - c.cy);
    expect(Math.abs(radius(90) - (c.R * (90 - 20)) / 90)).toBeLessThan(0.1); // the 20° floor
    expect(Math.abs(radius(270) - (c.R * (90 - 20)) / 90)).toBeLessThan(0.1);
    expect(Math.abs(radius(180) - (c.R * (90 - 35)) / 90)).toBeLessThan(0.1); // the mask's 35° peak
    expect(Math.abs(radius(165) - (c.R * (90 - 22.5)) / 90)).toBeLessThan(0.1); // halfway up its side (linear in azimuth)
    expect(radius(0)).toBeLessThan(0.1); // outside [20°, 340°]: all altitudes forbidden
    expect(radius(10)).toBeLessThan(0.1);
    // and the boundary points lie on the right bearing
    expect(unproject(profile[90][0], profile[90][1], c).az).toBeCloseTo(90, 1);
    expect(unproject(profile[180][0], profile[180][1], c).az).toBeCloseTo(180, 1);
  });

  it('the top of the allowed region: the ceiling, or the keyhole when it is lower', () => {
    const ring = (s: string) => {
      const d = pathD(s, 'data-part="forbidden-top"')!;
      const m = /^M(-?[\d.]+),(-?[\d.]+) a([\d.]+),([\d.]+)/.exec(d)!;
      return { r: Number(m[3]), leftX: Number(m[1]) };
    };
    const ceiling = ring(svg); // maxAltitude 80 < 90 − keyhole 5
    expect(ceiling.r).toBeCloseTo((c.R * (90 - 80)) / 90, 6);
    expect(ceiling.leftX).toBeCloseTo(c.cx - ceiling.r, 6);
    const keyhole = ring(render({ ...ENVELOPE, maxAltitude: 88, keyholeRadius: 15 })); // 90 − 15 = 75 < 88
    expect(keyhole.r).toBeCloseTo((c.R * 15) / 90, 6);
  });

  for (const body of ['sun', 'moon'] as const) {
    it(`the ${body === 'sun' ? 'Sun' : 'Moon'} avoidance circle at the cursor time is centred on the ${body === 'sun' ? 'Sun' : 'Moon'}'s ERFA az/alt`, () => {
      const radius = body === 'sun' ? ENVELOPE.sunAvoidance! : ENVELOPE.moonAvoidance!;
      const centre = { az: erfa[body].azimuth, alt: erfa[body].altitude };
      const d = pathD(svg, `data-part="${body}-zone"`)!;
      const pts = vertices(d);
      expect(pts.length).toBeGreaterThan(40);
      for (const [x, y] of pts) expect(Math.abs(separation(unproject(x, y, c), centre) - radius)).toBeLessThan(0.1);
    });
  }
});
