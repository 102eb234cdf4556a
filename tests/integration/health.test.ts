import { afterAll, beforeAll, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient } from './helpers/client';

let s: TestServer;
beforeAll(async () => {
  s = await startServer();
});
afterAll(() => s?.stop());

test('the built server answers its health check against a real SQLite file', async () => {
  const c = new ApiClient(s.url);
  const r = await c.get('/api/health');
  expect(r.status).toBe(200);
  expect(r.data.ok).toBe(true);
  // The built server computes on worker threads (dist/server/compute-worker.mjs), never in-process.
  expect(r.data.compute).toMatchObject({ mode: 'workers' });
  expect(r.data.compute.threads).toBeGreaterThanOrEqual(1);
});

test('a cross-origin POST is refused with 403 before any route runs', async () => {
  const c = new ApiClient(s.url);
  const r = await c.json('POST', '/api/health', {}, { origin: 'https://evil.example' });
  expect(r.status).toBe(403);
  expect(r.data.error.code).toBe('cross_origin');
});
