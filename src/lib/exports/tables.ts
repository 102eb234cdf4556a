/**
 * The CSV exports computed with the sky engine: positions of every target at one instant, and
 * visibility windows inside the envelope over a span. No database: a scene in, CSV text out.
 */
import type { SceneOut } from '../contracts/scene';
import { bodyPlace, evaluateEnvelope, observeAt, riseTransitSetDetailed, skyFrame, visibilityWindows, type Envelope, type WindowTarget } from '../sky';
import { fixed, toCsv, type Cell } from './csv';
import { cataloguePosition, siteInput, skyTarget } from './sky-targets';

const iso = (d: Date | undefined | null) => (d ? d.toISOString().replace(/\.\d{3}Z$/, 'Z') : null);
/** Next rise/transit/set are searched this far ahead of the instant. */
export const NEXT_EVENT_HORIZON_H = 48;

export const POSITIONS_COLUMNS = [
  'name', 'ra', 'dec', 'azimuth', 'altitude', 'airmass', 'next_rise', 'next_transit', 'next_set', 'inside_envelope',
  'kind', 'hour_angle', 'rise_set_note', 'envelope_violations', 'time',
] as const;

export interface PositionRow {
  name: string;
  kind: string;
  /** ICRS/J2000 as catalogued (custom, star); apparent topocentric in ICRS axes for a body. */
  ra: number | null;
  dec: number | null;
  azimuth: number;
  /** Apparent altitude, standard refraction (1013.25 hPa, 10 °C). */
  altitude: number;
  airmass: number | null;
  hourAngle: number;
  nextRise: string | null;
  nextTransit: string | null;
  nextSet: string | null;
  riseSetNote: string;
  /** null when the scene has no envelope. */
  insideEnvelope: boolean | null;
  violations: string[];
}

export function positionRows(scene: SceneOut, at: Date): PositionRow[] {
  const site = siteInput(scene.site);
  const f = skyFrame(site, at);
  const env = scene.envelope as Envelope | null;
  const needSun = env?.sunAvoidance !== undefined;
  const needMoon = env?.moonAvoidance !== undefined;
  const sun = env && needSun ? bodyPlace(f, 'sun') : null;
  const moon = env && needMoon ? bodyPlace(f, 'moon') : null;
  const until = new Date(at.getTime() + NEXT_EVENT_HORIZON_H * 3600000);
  const rows: PositionRow[] = [];
  for (const t of scene.targets) {
    const st = skyTarget(t, at);
    if (!st) continue;
    const o = observeAt(f, st);
    const pos = 'body' in st ? (() => { const b = bodyPlace(f, st.body); return { ra: b.raDeg, dec: b.decDeg }; })() : cataloguePosition(t);
    const ev = riseTransitSetDetailed(site, st, at, until);
    const next = (k: string) => iso(ev.events.find((e) => e.kind === k)?.time);
    let inside: boolean | null = null;
    let violations: string[] = [];
    if (env) {
      const e = evaluateEnvelope(
        env,
        { azDeg: o.azDeg, altDeg: o.altDeg, haHours: o.haHours, decDeg: o.decOfDateDeg },
        { sun: sun ? { azDeg: sun.azDeg, altDeg: sun.altDeg } : null, moon: moon ? { azDeg: moon.azDeg, altDeg: moon.altDeg } : null },
      );
      inside = e.allowed;
      violations = e.violations.map((v) => v.limit);
    }
    rows.push({
      name: t.name,
      kind: t.kind,
      ra: pos?.ra ?? null,
      dec: pos?.dec ?? null,
      azimuth: o.azDeg,
      altitude: o.altDeg,
      airmass: o.airmass,
      hourAngle: o.haHours,
      nextRise: next('rise'),
      nextTransit: next('transit'),
      nextSet: next('set'),
      riseSetNote: ev.alwaysUp ? 'circumpolar (no set within 48 h)' : ev.alwaysDown ? 'below the horizon (no rise within 48 h)' : '',
      insideEnvelope: inside,
      violations,
    });
  }
  return rows;
}

export function positionsCsv(scene: SceneOut, at: Date): string {
  const time = iso(at);
  const rows: Cell[][] = positionRows(scene, at).map((r) => [
    r.name,
    fixed(r.ra, 6),
    fixed(r.dec, 6),
    fixed(r.azimuth, 6),
    fixed(r.altitude, 6),
    fixed(r.airmass, 4),
    r.nextRise,
    r.nextTransit,
    r.nextSet,
    r.insideEnvelope === null ? null : r.insideEnvelope,
    r.kind,
    fixed(r.hourAngle, 6),
    r.riseSetNote,
    r.violations.join(' '),
    time,
  ]);
  return toCsv([...POSITIONS_COLUMNS], rows);
}

export const WINDOWS_COLUMNS = ['name', 'start', 'end', 'duration_min', 'opened_by', 'closed_by', 'note'] as const;
/** With no envelope, a target counts as visible when above the apparent horizon. */
export const HORIZON_ONLY: Envelope = { name: 'horizon', minAltitude: 0 };

export function windowsCsv(scene: SceneOut, from: Date, to: Date, opts: { stepSec?: number } = {}): string {
  const site = siteInput(scene.site);
  const mid = new Date((from.getTime() + to.getTime()) / 2);
  const targets: WindowTarget[] = [];
  for (const t of scene.targets) {
    const st = skyTarget(t, mid);
    if (st) targets.push({ name: t.name, ...st });
  }
  const env = (scene.envelope as Envelope | null) ?? HORIZON_ONLY;
  const result = visibilityWindows(site, env, targets, from, to, opts);
  const rows: Cell[][] = [];
  for (const r of result) {
    if (r.windows.length === 0) {
      rows.push([r.name, null, null, 0, null, null, r.reasons.length ? `no window; outside by ${r.reasons.join(', ')}` : 'no window']);
      continue;
    }
    for (const w of r.windows) {
      rows.push([r.name, iso(w.start), iso(w.end), fixed((w.end.getTime() - w.start.getTime()) / 60000, 1), w.openedBy, w.closedBy, scene.envelope ? '' : 'no envelope: above the horizon']);
    }
  }
  return toCsv([...WINDOWS_COLUMNS], rows);
}
