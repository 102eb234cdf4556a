/**
 * Presenter follow mode: POST /api/scenes/:id/presenter moves the presenter; followers on
 * GET /api/scenes/:id/presenter/stream or GET /api/shared/:token/presenter/stream receive
 * `event: step` (server-sent events, WHATWG HTML "Server-sent events" format).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';

let s: TestServer;
const as: Record<string, ApiClient> = {};
let teamId = '';
const site = { name: 'Stage', lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' };
const steps = [
  { id: 'a', time: '2026-03-21T01:10:00Z', caption: 'one' },
  { id: 'b', time: '2026-03-21T01:40:00Z', caption: 'two' },
  { id: 'c', time: '2026-03-21T02:10:00Z', caption: 'three' },
];

beforeAll(async () => {
  s = await startServer();
  for (const who of ['editor', 'reviewer', 'viewer', 'outsider'] as const) {
    as[who] = new ApiClient(s.url);
    await as[who].signIn(DEMO[who]);
  }
  as.anon = new ApiClient(s.url);
  teamId = (await as.editor.get('/api/me')).data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
});
afterAll(() => s?.stop());

async function scene() {
  return (await as.editor.post('/api/scenes', { teamId, title: 'Show', site, time: '2026-03-21T01:10:00Z', steps })).data.scene as { id: string };
}

interface SseEvent {
  event: string;
  data: string;
}

/** Opens an SSE stream and collects events until `until` matches or the timeout passes. */
function follow(url: string, cookie?: string) {
  const ac = new AbortController();
  const events: SseEvent[] = [];
  let buf = '';
  let status = 0;
  let contentType = '';
  const ready = fetch(url, { headers: cookie ? { cookie, accept: 'text/event-stream' } : { accept: 'text/event-stream' }, signal: ac.signal }).then(async (r) => {
    status = r.status;
    contentType = r.headers.get('content-type') ?? '';
    if (!r.ok || !r.body) return;
    const reader = r.body.getReader();
    const dec = new TextDecoder();
    void (async () => {
      try {
        for (;;) {
          const { value, done } = await reader.read();
          if (done) break;
          buf += dec.decode(value, { stream: true });
          let i: number;
          while ((i = buf.indexOf('\n\n')) >= 0) {
            const block = buf.slice(0, i);
            buf = buf.slice(i + 2);
            const ev: SseEvent = { event: 'message', data: '' };
            for (const line of block.split('\n')) {
              if (line.startsWith('event:')) ev.event = line.slice(6).trim();
              else if (line.startsWith('data:')) ev.data += line.slice(5).trim();
            }
            if (block.split('\n').some((l) => l.startsWith('event:') || l.startsWith('data:'))) events.push(ev);
          }
        }
      } catch {
        /* aborted */
      }
    })();
  });
  return {
    ready,
    events,
    status: () => status,
    contentType: () => contentType,
    close: () => ac.abort(),
    async waitFor(pred: (e: SseEvent) => boolean, timeoutMs = 8000): Promise<SseEvent> {
      const deadline = Date.now() + timeoutMs;
      while (Date.now() < deadline) {
        const hit = events.find(pred);
        if (hit) return hit;
        await new Promise((r) => setTimeout(r, 50));
      }
      throw new Error(`no matching event within ${timeoutMs} ms; got ${JSON.stringify(events)}`);
    },
  };
}

const cookieOf = (c: ApiClient) => [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; ');

describe('POST /api/scenes/:id/presenter', () => {
  test('editor+ sets the step; GET reads it back', async () => {
    const sc = await scene();
    expect((await as.viewer.get(`/api/scenes/${sc.id}/presenter`)).data.presenter).toBeNull();
    const r = await as.editor.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 1, time: '2026-03-21T01:45:00Z' });
    expect(r.status).toBe(200);
    expect(r.data.presenter).toMatchObject({ sceneId: sc.id, stepIndex: 1, stepId: 'b', time: '2026-03-21T01:45:00Z' });
    expect((await as.viewer.get(`/api/scenes/${sc.id}/presenter`)).data.presenter.stepIndex).toBe(1);
  });

  test.each([
    [{}, 'stepIndex'],
    [{ stepIndex: -1 }, 'stepIndex'],
    [{ stepIndex: 1.5 }, 'stepIndex'],
    [{ stepIndex: 3 }, 'stepIndex'], // the scene has steps 0..2
    [{ stepIndex: 0, time: 'now' }, 'time'],
  ])('400 naming the field: %j', async (body, field) => {
    const sc = await scene();
    const r = await as.editor.post(`/api/scenes/${sc.id}/presenter`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
  });

  test('401 anonymous, 403 viewer and reviewer, 404 other team', async () => {
    const sc = await scene();
    expect((await as.anon.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 0 })).status).toBe(401);
    expect((await as.viewer.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 0 })).status).toBe(403);
    expect((await as.reviewer.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 0 })).status).toBe(403);
    expect((await as.outsider.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 0 })).status).toBe(404);
  });
});

describe('presenter streams', () => {
  test('a member’s stream delivers the current step and then each change', async () => {
    const sc = await scene();
    await as.editor.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 0 });
    const f = follow(`${s.url}/api/scenes/${sc.id}/presenter/stream`, cookieOf(as.viewer));
    await f.ready;
    expect(f.status()).toBe(200);
    expect(f.contentType()).toMatch(/^text\/event-stream/);
    const first = await f.waitFor((e) => e.event === 'step');
    expect(JSON.parse(first.data)).toMatchObject({ stepIndex: 0, stepId: 'a' });
    await as.editor.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 2 });
    const next = await f.waitFor((e) => e.event === 'step' && JSON.parse(e.data).stepIndex === 2);
    expect(JSON.parse(next.data)).toMatchObject({ sceneId: sc.id, stepIndex: 2, stepId: 'c' });
    f.close();
  });

  test('a viewer link follows too; revoking the link ends its stream', async () => {
    const sc = await scene();
    const link = (await as.editor.post(`/api/scenes/${sc.id}/links`, { role: 'viewer' })).data;
    const f = follow(`${s.url}/api/shared/${link.token}/presenter/stream`);
    await f.ready;
    expect(f.status()).toBe(200);
    await as.editor.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 1 });
    const ev = await f.waitFor((e) => e.event === 'step');
    expect(JSON.parse(ev.data)).toMatchObject({ stepIndex: 1, stepId: 'b' });
    expect(JSON.parse(ev.data)).not.toHaveProperty('updatedBy');
    await as.editor.del(`/api/scenes/${sc.id}/links/${link.id}`);
    await f.waitFor((e) => e.event === 'end');
    f.close();
    const again = follow(`${s.url}/api/shared/${link.token}/presenter/stream`);
    await again.ready;
    expect(again.status()).toBe(404);
  });

  test('401 anonymous, 404 other team, 404 unknown token', async () => {
    const sc = await scene();
    const a = follow(`${s.url}/api/scenes/${sc.id}/presenter/stream`);
    await a.ready;
    expect(a.status()).toBe(401);
    const b = follow(`${s.url}/api/scenes/${sc.id}/presenter/stream`, cookieOf(as.outsider));
    await b.ready;
    expect(b.status()).toBe(404);
    const c = follow(`${s.url}/api/shared/AAAAAAAAAAAAAAAAAAAAAAAA/presenter/stream`);
    await c.ready;
    expect(c.status()).toBe(404);
  });

  test('a second app instance on the same database streams the same presenter state', async () => {
    const sc = await scene();
    const second = await startServer({ dbUrl: s.dbUrl });
    try {
      const viewer2 = new ApiClient(second.url);
      await viewer2.signIn(DEMO.viewer);
      const f = follow(`${second.url}/api/scenes/${sc.id}/presenter/stream`, cookieOf(viewer2));
      await f.ready;
      await as.editor.post(`/api/scenes/${sc.id}/presenter`, { stepIndex: 2 });
      const ev = await f.waitFor((e) => e.event === 'step' && JSON.parse(e.data).stepIndex === 2);
      expect(JSON.parse(ev.data).stepId).toBe('c');
      f.close();
    } finally {
      await second.kill();
    }
  });
});
