/**
 * iCalendar files (RFC 5545) of a scene's night and a team's subscription, read back with ical.js (an
 * independent parser, Mozilla's) and compared with the app's own fixed APIs: Sun and Moon times with
 * `GET /api/sky/events`, target windows with `GET /api/scenes/:id/night`, steps with the scene.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import ICAL from 'ical.js';
import { startServer, type TestServer } from './helpers/server';
import { sceneBody, signInCast, type Cast } from './helpers/hardening';

let s: TestServer;
let cast: Cast;
let scene: any;

interface Ev {
  uid: string;
  summary: string;
  start: Date;
  startUtc: boolean;
  end: Date | null;
  sequence: number;
  categories: string[];
  description: string;
}

function parse(text: string): { cal: ICAL.Component; events: Ev[] } {
  const cal = new ICAL.Component(ICAL.parse(text));
  const events = cal.getAllSubcomponents('vevent').map((c) => {
    const e = new ICAL.Event(c);
    return {
      uid: e.uid,
      summary: e.summary,
      start: e.startDate.toJSDate(),
      startUtc: e.startDate.zone?.tzid === 'UTC',
      end: c.hasProperty('dtend') ? e.endDate.toJSDate() : null,
      sequence: Number(c.getFirstPropertyValue('sequence') ?? 0),
      categories: c.getAllProperties('categories').flatMap((p) => p.getValues().map(String)),
      description: String(c.getFirstPropertyValue('description') ?? ''),
    };
  });
  return { cal, events };
}

async function ics(path: string, headers: Record<string, string> = {}) {
  const r = await fetch(s.url + path, { headers });
  return { status: r.status, type: r.headers.get('content-type') ?? '', text: await r.text() };
}
const cookie = (who: keyof Cast['clients']) => ({ cookie: [...cast.clients[who].cookies].map(([k, v]) => `${k}=${v}`).join('; ') });

beforeAll(async () => {
  s = await startServer();
  cast = await signInCast(s.url);
  const ed = cast.clients.editor;
  const list = (await ed.get(`/api/scenes?teamId=${cast.teamId}`)).data.scenes as Array<{ id: string }>;
  let source: string | null = null;
  for (const x of list) {
    const full = (await ed.get(`/api/scenes/${x.id}`)).data.scene;
    if (full.steps?.length && full.targets?.length) source = x.id;
  }
  if (!source) throw new Error('no demo scene with steps and targets');
  scene = (await ed.post('/api/scenes', { teamId: cast.teamId, fromSceneId: source, title: 'Calendar night' })).data.scene;
});
afterAll(() => s?.stop());

describe('GET /api/scenes/:id/calendar.ics', () => {
  let events: Ev[];
  let cal: ICAL.Component;
  beforeAll(async () => {
    const r = await ics(`/api/scenes/${scene.id}/calendar.ics`, cookie('viewer'));
    expect(r.status).toBe(200);
    expect(r.type).toMatch(/^text\/calendar/);
    ({ cal, events } = parse(r.text));
  });

  test('a VCALENDAR 2.0 with the site zone named and every time in UTC', () => {
    expect(cal.getFirstPropertyValue('version')).toBe('2.0');
    expect(cal.getFirstPropertyValue('prodid')).toBeTruthy();
    expect(cal.getFirstPropertyValue('x-wr-timezone')).toBe(scene.site.timeZone);
    expect(events.length).toBeGreaterThan(5);
    for (const e of events) expect(e.startUtc, e.summary).toBe(true);
    expect(new Set(events.map((e) => e.uid)).size).toBe(events.length);
  });

  test('Sun and Moon times equal GET /api/sky/events (to the second the file can hold)', async () => {
    for (const body of ['sun', 'moon'] as const) {
      const mine = events.filter((e) => e.categories.includes(body));
      expect(mine.length, body).toBeGreaterThan(body === 'sun' ? 4 : 0);
      const from = new Date(Math.min(...mine.map((e) => e.start.getTime())) - 3600000).toISOString();
      const to = new Date(Math.max(...mine.map((e) => e.start.getTime())) + 3600000).toISOString();
      const { lat, lon, height } = scene.site;
      const api = await cast.clients.anonymous.get(`/api/sky/events?lat=${lat}&lon=${lon}&height=${height}&body=${body}&from=${from}&to=${to}`);
      expect(api.status).toBe(200);
      for (const e of mine) {
        const kind = new RegExp(`-${body}-([a-z-]+?)(?:-\\d+)?@`).exec(e.uid)![1];
        const near = api.data.events.filter((x: any) => x.kind === kind).map((x: any) => Math.abs(Date.parse(x.time) - e.start.getTime()));
        expect(Math.min(...near), `${body} ${kind} at ${e.start.toISOString()}`).toBeLessThanOrEqual(1000);
      }
    }
    // the twilights of the night are all there
    const kinds = events.filter((e) => e.categories.includes('sun')).map((e) => /-sun-([a-z-]+?)(?:-\d+)?@/.exec(e.uid)![1]);
    expect(kinds).toEqual(expect.arrayContaining(['set', 'civil-dusk', 'nautical-dusk', 'astronomical-dusk', 'astronomical-dawn', 'nautical-dawn', 'civil-dawn', 'rise']));
  });

  test('target windows equal the night API’s windows', async () => {
    const night = await cast.clients.viewer.get(`/api/scenes/${scene.id}/night`);
    expect(night.status).toBe(200);
    const want = night.data.targets.flatMap((t: any) => t.windows.map((w: any) => ({ name: t.name, start: Date.parse(w.start), end: Date.parse(w.end) })));
    const got = events.filter((e) => e.categories.includes('window'));
    expect(got.length).toBe(want.length);
    expect(want.length).toBeGreaterThan(0);
    for (const w of want) {
      const e = got.find((x) => x.summary.startsWith(w.name) && Math.abs(x.start.getTime() - w.start) <= 1000);
      expect(e, `${w.name} ${new Date(w.start).toISOString()}`).toBeTruthy();
      expect(Math.abs(e!.end!.getTime() - w.end)).toBeLessThanOrEqual(1000);
    }
  });

  test('one event a briefing step, at its time', () => {
    const steps = events.filter((e) => e.categories.includes('step'));
    expect(steps.length).toBe(scene.steps.length);
    for (const st of scene.steps) {
      const e = steps.find((x) => x.uid.includes(`-step-${st.id}@`));
      expect(e!.start.toISOString().slice(0, 19)).toBe(new Date(st.time).toISOString().slice(0, 19));
    }
  });

  test('the night event spans sunset to sunrise and carries the planning note', () => {
    const n = events.find((e) => e.categories.includes('night'))!;
    const set = events.find((e) => /-sun-set@/.test(e.uid))!;
    const rise = events.find((e) => /-sun-rise@/.test(e.uid))!;
    expect(Math.abs(n.start.getTime() - set.start.getTime())).toBeLessThanOrEqual(1000);
    expect(Math.abs(n.end!.getTime() - rise.start.getTime())).toBeLessThanOrEqual(1000);
    expect(n.description).toContain('for planning');
  });

  test('stable UIDs: the same file twice, and after an edit the same UIDs with a higher SEQUENCE', async () => {
    const again = parse((await ics(`/api/scenes/${scene.id}/calendar.ics`, cookie('viewer'))).text).events;
    expect(again.map((e) => e.uid)).toEqual(events.map((e) => e.uid));
    const patched = await cast.clients.editor.patch(`/api/scenes/${scene.id}`, { version: scene.version, title: 'Calendar night (renamed)' });
    expect(patched.status).toBe(200);
    const after = parse((await ics(`/api/scenes/${scene.id}/calendar.ics`, cookie('viewer'))).text).events;
    expect(after.map((e) => e.uid).sort()).toEqual(events.map((e) => e.uid).sort());
    expect(after[0]!.sequence).toBeGreaterThan(events[0]!.sequence);
  });

  test('members only: 401 without a session, 404 for another team', async () => {
    expect((await ics(`/api/scenes/${scene.id}/calendar.ics`)).status).toBe(401);
    expect((await ics(`/api/scenes/${scene.id}/calendar.ics`, cookie('outsider'))).status).toBe(404);
  });
});

describe('the same under a share link', () => {
  test('a link holder gets the same events; a revoked link gets 404', async () => {
    const link = (await cast.clients.editor.post(`/api/scenes/${scene.id}/links`, { role: 'viewer' })).data;
    const shared = await ics(`/api/shared/${link.token}/calendar.ics`);
    expect(shared.status).toBe(200);
    const member = parse((await ics(`/api/scenes/${scene.id}/calendar.ics`, cookie('viewer'))).text).events;
    expect(parse(shared.text).events.map((e) => e.uid)).toEqual(member.map((e) => e.uid));
    expect(shared.text).toContain(`/s/${link.token}`);
    expect((await cast.clients.editor.del(`/api/scenes/${scene.id}/links/${link.id}`)).status).toBe(204);
    expect((await ics(`/api/shared/${link.token}/calendar.ics`)).status).toBe(404);
  });
});

describe('team subscription', () => {
  test('an editor makes a secret URL listing upcoming scenes; a viewer may not; revoking stops it', async () => {
    const path = `/api/teams/${cast.teamId}/calendar-feed`;
    expect((await cast.clients.viewer.post(path)).status).toBe(403);
    expect((await cast.clients.outsider.post(path)).status).toBe(404);
    const soon = new Date(Date.now() + 2 * 86400000);
    soon.setUTCSeconds(0, 0);
    const upcoming = (await cast.clients.editor.post('/api/scenes', { ...sceneBody(cast.teamId, 'Open night'), time: soon.toISOString() })).data.scene;
    const made = await cast.clients.editor.post(path);
    expect(made.status).toBe(201);
    expect(made.data.url).toMatch(/\/api\/calendars\/[A-Za-z0-9_-]{43}\.ics$/);
    const feedPath = new URL(made.data.url).pathname;
    const r = await ics(feedPath);
    expect(r.status).toBe(200);
    const { events } = parse(r.text);
    const e = events.find((x) => x.uid === `scene-${upcoming.id}@armilla.calendar`);
    expect(e).toBeTruthy();
    expect(e!.start.toISOString()).toBe(soon.toISOString());
    expect(e!.summary).toBe('Open night');
    expect(r.text).toContain(`/scenes/${upcoming.id}`);
    // the March 2026 demo scenes are in the past: not listed
    expect(events.some((x) => x.start.getTime() < Date.now() - 86400000)).toBe(false);
    // the list says one exists, without the secret
    const state = await cast.clients.owner.get(path);
    expect(state.data.feed.id).toBe(made.data.id);
    expect(JSON.stringify(state.data)).not.toContain(made.data.token);
    // a new URL replaces the old one
    const again = await cast.clients.owner.post(path);
    expect((await ics(feedPath)).status).toBe(404);
    expect((await cast.clients.editor.del(path)).status).toBe(204);
    expect((await ics(new URL(again.data.url).pathname)).status).toBe(404);
    expect((await cast.clients.editor.get(path)).data.feed).toBeNull();
  });
});
