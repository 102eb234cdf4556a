/**
 * Everything the printed briefing handout shows, computed from a scene: the all-sky chart's primitives
 * (see chart.ts for the projection), the night's events, the Moon's phase, the targets and the cautions.
 * No DOM, no database: a scene in, plain data out.
 */
import type { SceneOut } from '../contracts/scene';
import {
  bodyPlace,
  BODY_NAMES,
  circlePoints,
  greatCirclesAt,
  loadCatalogue,
  moonPhases,
  observeAt,
  separationDeg,
  skyEvents,
  skyFrame,
  starsToHorizontal,
  type BodyName,
  type SkyEvent,
  type SkyFrame,
} from '../sky';
import { cataloguePosition, siteInput, skyTarget } from '../exports/sky-targets';
import { altitudeRings, cardinalPositions, project, radiusOf, skyPath, skylinePath, starRadius, type ChartFrame } from './chart';

export const CHART: ChartFrame = { R: 220, cx: 260, cy: 250 };
export const CHART_SIZE = { width: 520, height: 500 };
/** Fainter stars would crowd a printed chart. */
export const CHART_STAR_LIMIT = 4.5;
const CIRCLE_POINTS = 240;

const BODY_LABEL: Record<BodyName, string> = {
  sun: 'Sun', moon: 'Moon', mercury: 'Mercury', venus: 'Venus', mars: 'Mars', jupiter: 'Jupiter', saturn: 'Saturn', uranus: 'Uranus', neptune: 'Neptune',
};

export interface ChartStar { hr: number; name: string | null; x: number; y: number; r: number; alt: number; az: number; mag: number }
export interface ChartMark { id: string; label: string; kind: string; x: number; y: number; alt: number; az: number }
export interface HandoutEvent { time: string; what: string; subject: string; kind: string }
export interface HandoutTarget {
  name: string; kind: string; ra: number | null; dec: number | null;
  alt: number; az: number; airmass: number | null;
  rise: string | null; transit: string | null; set: string | null; note: string;
}

export interface HandoutModel {
  title: string;
  description: string;
  site: SceneOut['site'];
  time: string;
  chart: {
    frame: ChartFrame;
    size: { width: number; height: number };
    rings: { alt: number; r: number }[];
    cardinals: { label: string; x: number; y: number }[];
    circles: { name: 'equator' | 'ecliptic' | 'meridian'; d: string }[];
    skyline: string;
    minAltitudeR: number | null;
    stars: ChartStar[];
    bodies: ChartMark[];
    targets: ChartMark[];
  };
  events: HandoutEvent[];
  window: { from: string; to: string };
  moon: { phaseName: string; illuminatedPercent: number; ageDays: number | null; alt: number; quarters: { kind: string; time: string }[] };
  sun: { alt: number; up: boolean };
  targets: HandoutTarget[];
  steps: { id: string; title: string; time: string; caption: string }[];
  solarCaution: boolean;
  solarReasons: string[];
}

export function moonPhaseName(phaseLonDeg: number): string {
  const p = ((phaseLonDeg % 360) + 360) % 360;
  const names = ['New Moon', 'Waxing crescent', 'First quarter', 'Waxing gibbous', 'Full Moon', 'Waning gibbous', 'Last quarter', 'Waning crescent'];
  return names[Math.floor(((p + 22.5) % 360) / 45)]!;
}

const EVENT_LABEL: Record<string, string> = {
  rise: 'rises', transit: 'transits', set: 'sets',
  'civil-dawn': 'civil dawn (Sun −6°)', 'civil-dusk': 'civil dusk (Sun −6°)',
  'nautical-dawn': 'nautical dawn (Sun −12°)', 'nautical-dusk': 'nautical dusk (Sun −12°)',
  'astronomical-dawn': 'astronomical dawn (Sun −18°)', 'astronomical-dusk': 'astronomical dusk (Sun −18°)',
  'new-moon': 'New Moon', 'first-quarter': 'First quarter', 'full-moon': 'Full Moon', 'last-quarter': 'Last quarter',
};

const iso = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, 'Z');
const round = (n: number, k = 2) => Math.round(n * 10 ** k) / 10 ** k;
/** Sun's upper limb on the horizon with standard refraction (USNO): apparent centre altitude ≈ −16′ (semidiameter). */
const SUN_UP_APPARENT_ALT = -16 / 60;

export interface HandoutOptions {
  /** Half-width of the events window around the scene time, hours (default 12). */
  windowHours?: number;
}

export function buildHandout(scene: SceneOut, opts: HandoutOptions = {}): HandoutModel {
  const site = siteInput(scene.site);
  const at = new Date(scene.time);
  const f = skyFrame(site, at);
  const half = (opts.windowHours ?? 12) * 3600000;
  const from = new Date(at.getTime() - half);
  const to = new Date(at.getTime() + half);

  const chart = buildChart(scene, { frame: f });
  const places = chart.places;

  // Targets
  const targets: HandoutTarget[] = [];
  const events: HandoutEvent[] = [];
  const push = (list: SkyEvent[], subject: string) => {
    for (const e of list) events.push({ time: iso(e.time), kind: e.kind, subject, what: `${subject} ${EVENT_LABEL[e.kind] ?? e.kind}` });
  };
  const sunEv = skyEvents(site, { body: 'sun' }, from, to);
  push(sunEv.events, 'Sun');
  const moonEv = skyEvents(site, { body: 'moon' }, from, to);
  push(moonEv.events.filter((e) => e.kind !== 'transit'), 'Moon');
  const solarReasons: string[] = [];
  const sunAvoid = Math.max(scene.envelope?.sunAvoidance ?? 0, 15);
  for (const t of scene.targets) {
    const st = skyTarget(t, at);
    if (!st) continue;
    const o = observeAt(f, st);
    const ev = skyEvents(site, st, from, to);
    const first = (k: string) => ev.events.find((e) => e.kind === k);
    const pos = cataloguePosition(t);
    targets.push({
      name: t.name,
      kind: t.kind,
      ra: pos?.ra ?? null,
      dec: pos?.dec ?? null,
      alt: o.altDeg,
      az: o.azDeg,
      airmass: o.airmass,
      rise: first('rise') ? iso(first('rise')!.time) : null,
      transit: first('transit') ? iso(first('transit')!.time) : null,
      set: first('set') ? iso(first('set')!.time) : null,
      note: ev.alwaysUp ? 'up all window' : ev.alwaysDown ? 'below the horizon all window' : '',
    });
    // The Sun's and the Moon's events are listed once already, under their own names.
    if (!(t.kind === 'body' && (t.body === 'sun' || t.body === 'moon'))) push(ev.events, t.name);
    if (t.kind === 'body' && t.body === 'sun') solarReasons.push(`the target "${t.name}" is the Sun`);
    else if ('raDeg' in st || 'body' in st) {
      const sep = separationDeg(o.azDeg, o.altDeg, places.sun.azDeg, places.sun.altDeg);
      if (sep < sunAvoid && places.sun.altDeg > SUN_UP_APPARENT_ALT - 1) solarReasons.push(`the target "${t.name}" is ${sep.toFixed(1)}° from the Sun`);
    }
  }
  events.sort((a, b) => a.time.localeCompare(b.time));

  // Solar caution
  if (places.sun.altDeg > SUN_UP_APPARENT_ALT) solarReasons.unshift(`the Sun is above the horizon at the scene time (altitude ${places.sun.altDeg.toFixed(1)}°)`);
  for (const s of scene.steps) {
    const sf = skyFrame(site, new Date(s.time));
    const sun = bodyPlace(sf, 'sun');
    if (sun.altDeg > SUN_UP_APPARENT_ALT) solarReasons.push(`the Sun is up at step "${s.title || s.id}" (${sun.altDeg.toFixed(1)}°)`);
  }

  const moon = places.moon;
  return {
    title: scene.title,
    description: scene.description,
    site: scene.site,
    time: scene.time,
    chart: chart.model,
    events,
    window: { from: iso(from), to: iso(to) },
    moon: {
      phaseName: moonPhaseName(moon.phaseLongitudeDeg ?? 0),
      illuminatedPercent: Math.round((moon.illuminatedFraction ?? 0) * 100),
      ageDays: moon.ageDays ?? null,
      alt: moon.altDeg,
      quarters: moonPhases(new Date(at.getTime() - 15 * 86400000), new Date(at.getTime() + 15 * 86400000)).map((q) => ({ kind: EVENT_LABEL[q.kind] ?? q.kind, time: iso(q.time) })),
    },
    sun: { alt: places.sun.altDeg, up: places.sun.altDeg > SUN_UP_APPARENT_ALT },
    targets,
    steps: scene.steps.map((s) => ({ id: s.id, title: s.title, time: s.time, caption: s.caption })),
    solarCaution: solarReasons.length > 0,
    solarReasons,
  };
}

/**
 * The all-sky chart of a scene at its time: stars to magnitude 4.5 (or the scene's limit), the celestial
 * equator, ecliptic and meridian, the Sun, Moon and planets and the targets above the horizon, the
 * skyline of the horizon mask and the envelope's altitude floor. Used by the handout and the thumbnails.
 * `frame` reuses an instant's SkyFrame already computed by the caller.
 */
export function buildChart(scene: SceneOut, opts: { frame?: SkyFrame } = {}): { model: HandoutModel['chart']; places: Record<BodyName, ReturnType<typeof bodyPlace>> } {
  const at = new Date(scene.time);
  const f = opts.frame ?? skyFrame(siteInput(scene.site), at);
  // Chart: stars
  const cat = loadCatalogue();
  const alt = new Float64Array(cat.count);
  const az = new Float64Array(cat.count);
  starsToHorizontal(cat, f, alt, az);
  const limit = Math.min(CHART_STAR_LIMIT, scene.layers.limitingMagnitude ?? CHART_STAR_LIMIT);
  const stars: ChartStar[] = [];
  for (let i = 0; i < cat.count; i++) {
    const mag = cat.vmag[i]!;
    if (!(mag <= limit) || alt[i]! < 0) continue;
    const p = project(alt[i]!, az[i]!, CHART);
    stars.push({ hr: cat.hr[i]!, name: cat.name[i] ?? null, x: round(p.x), y: round(p.y), r: round(starRadius(mag), 2), alt: alt[i]!, az: az[i]!, mag });
  }

  // Great circles (geometric; refraction lifts them by < 0.6° at the horizon, invisible at this scale)
  const gc = greatCirclesAt(f);
  const circles = (['equator', 'ecliptic', 'meridian'] as const).map((name) => {
    const pts = circlePoints(gc[name].poleEnu, CIRCLE_POINTS);
    const list: { alt: number; az: number }[] = [];
    for (let i = 0; i < CIRCLE_POINTS; i++) {
      const e = pts[3 * i]!, n = pts[3 * i + 1]!, u = pts[3 * i + 2]!;
      list.push({ alt: (Math.atan2(u, Math.hypot(e, n)) * 180) / Math.PI, az: (((Math.atan2(e, n) * 180) / Math.PI) + 360) % 360 });
    }
    return { name, d: skyPath(list, CHART, true) };
  });

  // Bodies
  const places = Object.fromEntries(BODY_NAMES.map((b) => [b, bodyPlace(f, b)])) as Record<BodyName, ReturnType<typeof bodyPlace>>;
  const bodies: ChartMark[] = BODY_NAMES.filter((b) => places[b].altDeg >= 0).map((b) => {
    const p = project(places[b].altDeg, places[b].azDeg, CHART);
    return { id: b, label: BODY_LABEL[b], kind: 'body', x: round(p.x), y: round(p.y), alt: places[b].altDeg, az: places[b].azDeg };
  });

  // Targets above the horizon
  const targets: ChartMark[] = [];
  for (const t of scene.targets) {
    const st = skyTarget(t, at);
    if (!st) continue;
    const o = observeAt(f, st);
    if (o.altDeg < 0) continue;
    const p = project(o.altDeg, o.azDeg, CHART);
    targets.push({ id: t.id, label: t.name, kind: t.kind, x: round(p.x), y: round(p.y), alt: o.altDeg, az: o.azDeg });
  }
  const envelope = scene.envelope;
  return {
    places,
    model: {
      frame: CHART,
      size: CHART_SIZE,
      rings: altitudeRings(CHART).map((r) => ({ alt: r.alt, r: round(r.r) })),
      cardinals: cardinalPositions(CHART, 16).map((c) => ({ label: c.label, x: round(c.x), y: round(c.y) })),
      circles,
      skyline: envelope?.horizonMask?.length ? skylinePath(envelope.horizonMask, CHART) : '',
      minAltitudeR: envelope?.minAltitude !== undefined && envelope.minAltitude > 0 ? round(radiusOf(envelope.minAltitude, CHART.R)) : null,
      stars,
      bodies,
      targets,
    },
  };
}

/** "19:42" in the site's zone and the zone's short name, plus UTC. */
export function formatLocal(isoTime: string, timeZone: string): { local: string; date: string; utc: string; zone: string } {
  const d = new Date(isoTime);
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short' }).formatToParts(d);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? '';
  const date = new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' }).format(d);
  return { local: `${get('hour')}:${get('minute')}`, zone: get('timeZoneName'), date, utc: `${d.toISOString().slice(11, 16)} UTC` };
}
