/**
 * A scene's night as an iCalendar file (RFC 5545) written with ical-generator: the Sun's events and the
 * twilights, the Moon's rise, transit and set, each target's windows inside the scene's envelope, the
 * night itself and the briefing steps. Decision and conventions: README.md in this folder.
 *
 * Times are UTC (`…Z`, no VTIMEZONE needed); the site's zone is named in X-WR-TIMEZONE and every
 * description gives the local time as well. UIDs are built from the scene id, the night's date and what
 * the event is, so importing the file again updates the events rather than adding copies; SEQUENCE is
 * the scene's version and DTSTAMP its last change, so the same scene always gives the same file.
 */
import ical, { type ICalCalendar } from 'ical-generator';
import type { SceneOut } from '../../contracts/scene';
import { sceneNight, nightData, siteInputOf } from '../../sky/night';
import { skyEvents, type EventKind } from '../../sky/events';
import { nightInput } from '../../night/query';

export const PRODUCT_ID = { company: 'Armilla', product: 'Armilla night calendar', language: 'EN' } as const;
export const UID_DOMAIN = 'armilla.calendar';
export const PLANNING_NOTE = 'Computed times are for planning; local rules and instrument interlocks take precedence.';
export const SOLAR_CAUTION = 'Solar caution: the Sun is above the horizon during part of this interval. Never point optics near the Sun without a certified solar filter.';

const SUN_LABEL: Record<EventKind, string> = {
  rise: 'Sunrise',
  set: 'Sunset',
  transit: 'Sun due south/north (transit)',
  'civil-dusk': 'Civil dusk (Sun 6° down)',
  'nautical-dusk': 'Nautical dusk (Sun 12° down)',
  'astronomical-dusk': 'Astronomical dusk (Sun 18° down): full dark begins',
  'astronomical-dawn': 'Astronomical dawn (Sun 18° down): full dark ends',
  'nautical-dawn': 'Nautical dawn (Sun 12° down)',
  'civil-dawn': 'Civil dawn (Sun 6° down)',
};
const MOON_LABEL: Partial<Record<EventKind, string>> = { rise: 'Moonrise', set: 'Moonset', transit: 'Moon crosses the meridian' };

/** "21:14 Europe/Madrid (2026-03-20)". */
export function localTime(t: Date, timeZone: string): string {
  try {
    const f = new Intl.DateTimeFormat('en-GB', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' });
    const p = Object.fromEntries(f.formatToParts(t).map((x) => [x.type, x.value]));
    return `${p.hour}:${p.minute} ${timeZone} (${p.year}-${p.month}-${p.day})`;
  } catch {
    return `${t.toISOString().slice(11, 16)} UTC`;
  }
}

const utcLabel = (t: Date) => `${t.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

/** The night's date at the site (the evening it starts), used in UIDs: stable while the scene keeps its night. */
function nightKey(from: number, timeZone: string): string {
  try {
    return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(from)).replaceAll('-', '');
  } catch {
    return new Date(from).toISOString().slice(0, 10).replaceAll('-', '');
  }
}

const slug = (s: string) =>
  s
    .normalize('NFKD')
    .replace(/\p{M}+/gu, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40) || 'x';

export interface CalendarLinks {
  /** Where the scene opens (the scene page, or the share link's page). */
  sceneUrl: string;
}

export interface SceneCalendarEvent {
  uid: string;
  kind: 'night' | 'sun' | 'moon' | 'window' | 'step';
  summary: string;
  start: Date;
  end: Date | null;
  description: string;
}

/** The events of a scene's night, in time order (pure: what the file holds). */
export function sceneNightEvents(scene: SceneOut): { events: SceneCalendarEvent[]; from: number; to: number; polar: boolean } {
  const zone = scene.site.timeZone || 'UTC';
  const night = sceneNight(scene.site, new Date(scene.time));
  const key = nightKey(night.from, zone);
  const site = siteInputOf(scene.site);
  const base = `scene-${scene.id}-${key}`;
  const events: SceneCalendarEvent[] = [];
  const when = (t: Date) => `${utcLabel(t)} · ${localTime(t, zone)}`;
  // An hour either side so that sunset at the night's start and sunrise at its end are inside the span.
  const spanFrom = new Date(night.from - 3600000);
  const spanTo = new Date(night.to + 3600000);
  const sun = skyEvents(site, { body: 'sun' }, spanFrom, spanTo).events;
  const counts = new Map<string, number>();
  const nth = (k: string) => {
    const n = (counts.get(k) ?? 0) + 1;
    counts.set(k, n);
    return n === 1 ? '' : `-${n}`;
  };
  for (const e of sun) {
    events.push({ uid: `${base}-sun-${e.kind}${nth(`sun-${e.kind}`)}@${UID_DOMAIN}`, kind: 'sun', summary: `${SUN_LABEL[e.kind]} · ${scene.site.name}`, start: e.time, end: null, description: when(e.time) });
  }
  for (const e of skyEvents(site, { body: 'moon' }, spanFrom, spanTo).events) {
    const label = MOON_LABEL[e.kind];
    if (!label) continue;
    events.push({ uid: `${base}-moon-${e.kind}${nth(`moon-${e.kind}`)}@${UID_DOMAIN}`, kind: 'moon', summary: `${label} · ${scene.site.name}`, start: e.time, end: null, description: when(e.time) });
  }
  const sunUp = (a: Date, b: Date) => {
    // The Sun is up in [a, b] if a rise/set falls inside, or the interval starts while it is up.
    const lastBefore = sun.filter((e) => (e.kind === 'rise' || e.kind === 'set') && e.time <= a).at(-1);
    return sun.some((e) => (e.kind === 'rise' || e.kind === 'set') && e.time > a && e.time < b) || lastBefore?.kind === 'rise' || night.polar;
  };
  // The night's edges from the refined events (sceneNight's own edges come from a coarser search).
  const nearest = (kind: EventKind, t: number) =>
    sun.filter((e) => e.kind === kind && Math.abs(e.time.getTime() - t) < 15 * 60000).sort((a, b) => Math.abs(a.time.getTime() - t) - Math.abs(b.time.getTime() - t))[0]?.time;
  const nightStart = (!night.polar && nearest('set', night.from)) || new Date(night.from);
  const nightEnd = (!night.polar && nearest('rise', night.to)) || new Date(night.to);
  events.push({
    uid: `${base}-night@${UID_DOMAIN}`,
    kind: 'night',
    summary: `Night at ${scene.site.name}: ${scene.title}`,
    start: nightStart,
    end: nightEnd,
    description: [
      night.polar ? 'The Sun neither sets nor rises within a day here: the 24 hours around the scene time.' : 'Sunset to sunrise.',
      `From ${when(nightStart)}`,
      `to ${when(nightEnd)}`,
      night.polar ? SOLAR_CAUTION : '',
      PLANNING_NOTE,
    ]
      .filter(Boolean)
      .join('\n'),
  });
  const data = nightData(nightInput(scene, { step: 30, bodies: [] }));
  for (const t of data.targets) {
    t.windows.forEach((w, i) => {
      const start = new Date(w.start);
      const end = new Date(w.end);
      events.push({
        uid: `${base}-window-${slug(t.name)}-${i + 1}@${UID_DOMAIN}`,
        kind: 'window',
        summary: `${t.name} observable (${data.envelope?.name ?? 'above the horizon'})`,
        start,
        end,
        description: [
          `Inside the ${data.envelope ? `envelope “${data.envelope.name}”` : 'horizon'} from ${when(start)} to ${when(end)}.`,
          `Opened by: ${w.openedBy}. Closed by: ${w.closedBy}.`,
          sunUp(start, end) ? SOLAR_CAUTION : '',
          PLANNING_NOTE,
        ]
          .filter(Boolean)
          .join('\n'),
      });
    });
  }
  scene.steps.forEach((s, i) => {
    const t = new Date(s.time);
    events.push({
      uid: `scene-${scene.id}-step-${s.id}@${UID_DOMAIN}`,
      kind: 'step',
      summary: `Step ${i + 1}${s.title ? `: ${s.title}` : ''} · ${scene.title}`,
      start: t,
      end: null,
      description: [when(t), s.caption].filter(Boolean).join('\n\n'),
    });
  });
  events.sort((a, b) => a.start.getTime() - b.start.getTime());
  return { events, from: night.from, to: night.to, polar: night.polar };
}

function newCalendar(name: string, timeZone: string, description: string): ICalCalendar {
  const cal = ical({ name, prodId: PRODUCT_ID, description });
  cal.x([{ key: 'X-WR-TIMEZONE', value: timeZone }]);
  return cal;
}

export function sceneCalendar(scene: SceneOut, links: CalendarLinks): string {
  const zone = scene.site.timeZone || 'UTC';
  const { events } = sceneNightEvents(scene);
  const cal = newCalendar(
    `${scene.title} — night at ${scene.site.name}`,
    zone,
    `Times in UTC; the site keeps ${zone}. ${PLANNING_NOTE}`,
  );
  const stamp = new Date(scene.updatedAt);
  for (const e of events) {
    cal.createEvent({
      id: e.uid,
      sequence: scene.version,
      stamp,
      start: e.start,
      ...(e.end ? { end: e.end } : {}),
      summary: e.summary,
      description: `${e.description}\n\n${links.sceneUrl}`,
      location: { title: `${scene.site.name} (${scene.site.lat.toFixed(4)}°, ${scene.site.lon.toFixed(4)}°)`, geo: { lat: scene.site.lat, lon: scene.site.lon } },
      url: links.sceneUrl,
      categories: [{ name: e.kind }],
    });
  }
  return cal.toString();
}

export interface FeedScene {
  id: string;
  title: string;
  time: string;
  site: { name: string; lat: number; lon: number; timeZone?: string };
  version: number;
  updatedAt: Date;
}

/** A team's subscription feed: one event per upcoming scene at its time, with the site and a link. */
export function teamFeedCalendar(teamName: string, scenes: FeedScene[], sceneUrl: (id: string) => string, durationMin = 60): string {
  const cal = newCalendar(`${teamName} — Armilla scenes`, 'UTC', `Upcoming scenes of ${teamName}. Times in UTC; each event names its site's zone. ${PLANNING_NOTE}`);
  cal.ttl(3600);
  for (const s of scenes) {
    const start = new Date(s.time);
    const zone = s.site.timeZone || 'UTC';
    cal.createEvent({
      id: `scene-${s.id}@${UID_DOMAIN}`,
      sequence: s.version,
      stamp: s.updatedAt,
      start,
      end: new Date(start.getTime() + durationMin * 60000),
      summary: s.title,
      description: `${utcLabel(start)} · ${localTime(start, zone)}\nSite: ${s.site.name}\n${sceneUrl(s.id)}`,
      location: { title: `${s.site.name} (${s.site.lat.toFixed(4)}°, ${s.site.lon.toFixed(4)}°)`, geo: { lat: s.site.lat, lon: s.site.lon } },
      url: sceneUrl(s.id),
    });
  }
  return cal.toString();
}

export const icsResponse = (body: string, filename: string, cache = 'no-store') =>
  new Response(body, {
    status: 200,
    headers: {
      'content-type': 'text/calendar; charset=utf-8',
      'content-disposition': `attachment; filename="${filename.replace(/[^\w.-]+/g, '-')}"`,
      'cache-control': cache,
    },
  });
