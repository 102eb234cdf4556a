/**
 * Scale-out: two app processes on one SQLite file behave as one product. Sessions, rate-limit counters,
 * scene writes and the presenter's step live in the database, so instance B sees what instance A did.
 */
import { existsSync } from 'node:fs';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { sceneBody } from './helpers/hardening';

let a: TestServer;
let b: TestServer;

beforeAll(async () => {
  a = await startServer();
  b = await startServer({ dbUrl: a.dbUrl });
});
afterAll(async () => {
  await b?.stop();
  await a?.stop();
});

/** The same cookies, pointed at the other instance. */
function onOther(c: ApiClient, base: string): ApiClient {
  const d = new ApiClient(base);
  for (const [k, v] of c.cookies) d.cookies.set(k, v);
  return d;
}

test('a session created on A works on B, and signing out on B ends it on A', async () => {
  const onA = new ApiClient(a.url);
  await onA.signIn(DEMO.reviewer);
  const onB = onOther(onA, b.url);
  const me = await onB.get('/api/me');
  expect(me.status).toBe(200);
  expect(me.data.user.email).toBe(DEMO.reviewer);

  const out = await onB.post('/api/auth/sign-out');
  expect(out.status).toBe(204);
  expect((await onA.get('/api/me')).status).toBe(401);
});

/** Wrong-password attempts, alternating between `instances`, until the first 429; returns the 401s before it. */
async function failuresUntilLimited(email: string, instances: string[]): Promise<{ failures: number; retryAfter: string | null }> {
  for (let i = 0; i < 100; i++) {
    const c = new ApiClient(instances[i % instances.length]);
    const r = await c.post('/api/auth/sign-in', { email, password: 'not-the-password' });
    if (r.status === 429) return { failures: i, retryAfter: r.headers.get('retry-after') };
    expect(r.status).toBe(401);
  }
  throw new Error(`no 429 after 100 failed sign-ins for ${email}`);
}

test('failed sign-ins are counted across both instances', async () => {
  // The per-address limit is shared by both measurements (same loopback address): it is far larger
  // than twice the per-e-mail limit, so the per-e-mail limit is what each measurement meets first.
  const single = await failuresUntilLimited('nobody-1@elsewhere.example', [a.url]);
  const both = await failuresUntilLimited('nobody-2@elsewhere.example', [a.url, b.url]);
  expect(single.failures).toBeGreaterThan(0);
  // If each process kept its own counter, alternating would allow twice as many failures.
  expect(both.failures).toBe(single.failures);
  expect(Number(both.retryAfter)).toBeGreaterThan(0);
  // and the limit answers on either instance
  const onA = await new ApiClient(a.url).post('/api/auth/sign-in', { email: 'nobody-2@elsewhere.example', password: 'x' });
  const onB = await new ApiClient(b.url).post('/api/auth/sign-in', { email: 'nobody-2@elsewhere.example', password: 'x' });
  expect([onA.status, onB.status]).toEqual([429, 429]);
}, 180_000);

test('a scene written on A is read on B, and an edit on B bumps the version seen on A', async () => {
  const editorA = new ApiClient(a.url);
  await editorA.signIn(DEMO.editor);
  const me = await editorA.get('/api/me');
  const teamId = me.data.teams[0].id;
  const created = await editorA.post('/api/scenes', sceneBody(teamId, 'Written on A'));
  expect(created.status).toBe(201);
  const id = created.data.scene.id;

  const editorB = onOther(editorA, b.url);
  const read = await editorB.get(`/api/scenes/${id}`);
  expect(read.status).toBe(200);
  expect(read.data.scene.title).toBe('Written on A');

  const patched = await editorB.patch(`/api/scenes/${id}`, { version: read.data.scene.version, title: 'Edited on B' });
  expect(patched.status).toBe(200);
  const again = await editorA.get(`/api/scenes/${id}`);
  expect(again.data.scene.title).toBe('Edited on B');
  expect(again.data.scene.version).toBe(read.data.scene.version + 1);
  // a stale write on A is refused: the version check spans instances
  const stale = await editorA.patch(`/api/scenes/${id}`, { version: read.data.scene.version, title: 'Stale on A' });
  expect(stale.status).toBe(409);
});

const PRESENTER_ROUTE = 'src/pages/api/shared/[token]/presenter/stream.ts';

/** Reads an SSE stream until `match` returns true for an event's data, or the deadline passes. */
async function readEvents(url: string, headers: Record<string, string>, match: (data: unknown) => boolean, ms: number) {
  const ac = new AbortController();
  const timer = setTimeout(() => ac.abort(), ms);
  const seen: unknown[] = [];
  try {
    const r = await fetch(url, { headers: { accept: 'text/event-stream', ...headers }, signal: ac.signal });
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/text\/event-stream/);
    const reader = r.body!.getReader();
    const dec = new TextDecoder();
    let buf = '';
    for (;;) {
      const { value, done } = await reader.read();
      if (done) break;
      buf += dec.decode(value, { stream: true });
      let cut: number;
      while ((cut = buf.indexOf('\n\n')) >= 0) {
        const block = buf.slice(0, cut);
        buf = buf.slice(cut + 2);
        const data = block
          .split('\n')
          .filter((l) => l.startsWith('data:'))
          .map((l) => l.slice(5).trim())
          .join('\n');
        if (!data) continue;
        let parsed: unknown = data;
        try {
          parsed = JSON.parse(data);
        } catch {
          /* plain text event */
        }
        seen.push(parsed);
        if (match(parsed)) {
          ac.abort();
          return { found: parsed, seen };
        }
      }
    }
  } catch (e) {
    if (!ac.signal.aborted) throw e;
  } finally {
    clearTimeout(timer);
  }
  return { found: undefined, seen };
}

test.skipIf(!existsSync(PRESENTER_ROUTE))('presenter follow: a step posted on A reaches a follower streaming from B', async () => {
  const editorA = new ApiClient(a.url);
  await editorA.signIn(DEMO.editor);
  const list = await editorA.get('/api/scenes');
  // a demo scene with at least two steps (the briefing)
  let sceneId = '';
  for (const s of list.data.scenes) {
    const full = await editorA.get(`/api/scenes/${s.id}`);
    if (full.data.scene.steps?.length >= 2) {
      sceneId = s.id;
      break;
    }
  }
  expect(sceneId, 'a demo scene with steps').not.toBe('');
  const link = await editorA.post(`/api/scenes/${sceneId}/links`, { role: 'viewer' });
  expect(link.status).toBe(201);

  // follower on B: the viewer link's presenter stream (no account)
  const streamUrl = `${b.url}/api/shared/${link.data.token}/presenter/stream`;
  const follow = readEvents(streamUrl, {}, (d) => (d as { stepIndex?: number })?.stepIndex === 1, 60_000);
  // give the stream a moment to open before the step moves (the stream also sends the current state first)
  await new Promise((r) => setTimeout(r, 500));
  const step = await editorA.post(`/api/scenes/${sceneId}/presenter`, { stepIndex: 1 });
  expect(step.status).toBeLessThan(300);
  const { found, seen } = await follow;
  expect(found, `events seen on B: ${JSON.stringify(seen)}`).toBeTruthy();
}, 120_000);
