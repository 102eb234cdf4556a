/**
 * The API description against a real server: `GET /api/openapi.json` lists exactly the (path, method)
 * pairs of the route files under src/pages/api that a personal token can reach (the one definition in
 * src/lib/contracts/token-access.ts); the document is valid OpenAPI 3.1 by @seriousme/openapi-schema-validator
 * (the published JSON Schemas of the OpenAPI Initiative); the worked examples of the API page, run as they
 * are with /usr/bin/python3 and bash + curl + jq, write CSV files whose numbers equal the night API's; and
 * `/docs/api` lists every operation.
 */
import { execFile, execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Validator } from '@seriousme/openapi-schema-validator';
import { scopeNeeded, tokenReachable } from '../../src/lib/contracts/token-access';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { discoverRoutes } from './helpers/hardening';

const run = promisify(execFile);
const HTTP_METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;
const EXAMPLES = join('src', 'lib', 'docs', 'examples');

/** `/api/scenes/[id]/links/[linkId]` → `/api/scenes/{id}/links/{linkId}` (OpenAPI path templating). */
const templateOf = (pattern: string) => pattern.replace(/\[(\w+)\]/g, '{$1}');

/** `GET /api/scenes/{id}` for every route file and exported method a token can reach. */
function treeOperations(): Set<string> {
  return new Set(
    discoverRoutes()
      .map((r) => ({ method: r.method, path: templateOf(r.pattern) }))
      .filter((r) => tokenReachable(r.path))
      .map((r) => `${r.method} ${r.path}`),
  );
}

function documentedOperations(doc: any): Set<string> {
  const out = new Set<string>();
  for (const [path, item] of Object.entries<any>(doc.paths ?? {})) {
    for (const m of HTTP_METHODS) if (item[m]) out.add(`${m.toUpperCase()} ${path}`);
  }
  return out;
}

/** A schema with its `$ref` into components followed. */
const deref = (schema: any): any => (schema?.$ref ? deref(doc.components.schemas[schema.$ref.replace('#/components/schemas/', '')]) : schema);

const minus = (a: Set<string>, b: Set<string>) => [...a].filter((x) => !b.has(x)).sort();

let s: TestServer;
let doc: any;
let token: string;
let sceneId: string;
let dir: string;

async function bearer(path: string) {
  const r = await fetch(s.url + path, { headers: { authorization: `Bearer ${token}` } });
  return { status: r.status, data: (await r.json()) as any };
}

beforeAll(async () => {
  s = await startServer();
  dir = mkdtempSync(join(tmpdir(), 'armilla-openapi-'));
  const r = await fetch(`${s.url}/api/openapi.json`);
  if (r.status !== 200) throw new Error(`openapi.json: ${r.status}`);
  doc = await r.json();
  const editor = new ApiClient(s.url);
  await editor.signIn(DEMO.editor);
  const made = await editor.post('/api/tokens', { name: 'Night to CSV', scope: 'read' });
  if (made.status !== 201) throw new Error(`token: ${made.status} ${JSON.stringify(made.data)}`);
  token = made.data.token;
  // A demo scene with targets (seeded by the harness, src/lib/server/seed-scenes.ts).
  const list = await editor.get('/api/scenes');
  sceneId = list.data.scenes.find((x: { title: string }) => x.title === 'Equinox evening briefing').id;
}, 60_000);
afterAll(async () => {
  await s?.stop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('GET /api/openapi.json', () => {
  test('documents every token-reachable route file and method, and nothing that is not in the tree', () => {
    const tree = treeOperations();
    const documented = documentedOperations(doc);
    // The walk itself found the tree (a broken walk would make both lists empty and equal).
    expect(tree.size).toBeGreaterThan(60);
    expect(tree.has('GET /api/scenes/{id}/night')).toBe(true);
    expect(tree.has('POST /api/tokens')).toBe(false); // session only
    expect(minus(tree, documented), 'route files a token can reach that the document lacks').toEqual([]);
    expect(minus(documented, tree), 'documented operations with no route file').toEqual([]);
  });

  test('the comparison notices a route dropped from the document', () => {
    const cut = structuredClone(doc);
    delete cut.paths['/api/scenes/{id}/night'].get;
    expect(minus(treeOperations(), documentedOperations(cut))).toEqual(['GET /api/scenes/{id}/night']);
  });

  test('is a valid OpenAPI 3.1 document', async () => {
    const v = new Validator();
    const res = await v.validate(structuredClone(doc));
    expect(res.errors ?? []).toEqual([]);
    expect(res.valid).toBe(true);
    expect(v.version).toBe('3.1');
    expect(doc.openapi).toMatch(/^3\.1\./);
  });

  test('each operation has a summary, a tag, the scope it needs and the error shape for its 4xx', () => {
    const tags = new Set(doc.tags.map((t: { name: string }) => t.name));
    for (const [path, item] of Object.entries<any>(doc.paths)) {
      for (const m of HTTP_METHODS) {
        const op = item[m];
        if (!op) continue;
        const where = `${m.toUpperCase()} ${path}`;
        expect(op.summary, where).toBeTruthy();
        expect(op.tags?.length, where).toBe(1);
        expect(tags.has(op.tags[0]), where).toBe(true);
        const scope = scopeNeeded(m, path);
        expect(op['x-token-scope'], where).toBe(scope);
        expect(op.security, where).toContainEqual({ bearerToken: [scope] });
        expect(op.security, where).toContainEqual({ sessionCookie: [] });
        for (const [status, res] of Object.entries<any>(op.responses)) {
          const answer = res.$ref ? doc.components.responses[res.$ref.replace('#/components/responses/', '')] : res;
          if (Number(status) >= 400) expect(answer.content['application/json'].schema, `${where} ${status}`).toEqual({ $ref: '#/components/schemas/Error' });
        }
        expect(op.responses['401'], where).toBeDefined();
      }
    }
    expect(doc.components.schemas.Error.properties.error.required).toEqual(['code', 'message']);
    expect(doc.components.securitySchemes.bearerToken).toMatchObject({ type: 'http', scheme: 'bearer' });
    expect(doc.components.securitySchemes.sessionCookie).toMatchObject({ type: 'apiKey', in: 'cookie', name: 'armilla_session' });
  });

  test('write operations say so; a read token may still ask for visibility windows', () => {
    expect(doc.paths['/api/scenes/{id}'].patch['x-token-scope']).toBe('write');
    expect(doc.paths['/api/scenes/{id}'].get['x-token-scope']).toBe('read');
    expect(doc.paths['/api/sky/windows'].post['x-token-scope']).toBe('read');
  });

  test('bodies, parameters and answers come from the routes’ own zod schemas', () => {
    // The scene PATCH body (knownKeysOnly around the shape): its fields, `version` required.
    const patch = doc.paths['/api/scenes/{id}'].patch.requestBody.content['application/json'].schema;
    expect(patch.required).toContain('version');
    expect(Object.keys(patch.properties)).toEqual(expect.arrayContaining(['version', 'title', 'site', 'time', 'targets', 'steps']));
    expect(patch.properties.targets.type).toBe('array');
    // The token create body is session-only, so not here; the link body is.
    const link = doc.paths['/api/scenes/{id}/links'].post.requestBody.content['application/json'].schema;
    expect(link.properties.role.enum).toEqual(['viewer', 'reviewer']);
    // The night query: from, to, at, step, bodies; the path parameter id.
    const night = doc.paths['/api/scenes/{id}/night'].get;
    const params = night.parameters.map((p: { in: string; name: string }) => `${p.in}:${p.name}`);
    expect(params).toEqual(expect.arrayContaining(['path:id', 'query:from', 'query:to', 'query:step', 'query:bodies']));
    const answer = deref(night.responses['200'].content['application/json'].schema);
    expect(answer.required).toEqual(expect.arrayContaining(['site', 'from', 'to', 'step', 'sun', 'moon', 'targets']));
    expect(deref(answer.properties.targets.items).properties.samples.items.required).toEqual(['time', 'altitude', 'azimuth', 'airmass']);
    // Shapes used by several operations are described once: the scene body's targets refer to Target.
    expect(patch.properties.targets.items).toEqual({ $ref: '#/components/schemas/Target' });
    expect(deref(patch.properties.targets.items).oneOf).toHaveLength(3);
    // A scene answer: the Scene shape, with the version a PATCH must send back.
    const got = deref(doc.paths['/api/scenes/{id}'].get.responses['200'].content['application/json'].schema);
    expect(deref(got.properties.scene).required).toEqual(expect.arrayContaining(['id', 'teamId', 'version', 'site', 'time', 'targets']));
    // The compute API's body keeps its limits (API contract: lat −90..90).
    const windows = doc.paths['/api/sky/windows'].post.requestBody.content['application/json'].schema;
    expect(windows.properties.site.properties.lat).toMatchObject({ type: 'number', minimum: -90, maximum: 90 });
  });

  test('is cached: an ETag, a public Cache-Control and 304 for a repeat', async () => {
    const r = await fetch(`${s.url}/api/openapi.json`);
    const etag = r.headers.get('etag');
    expect(etag).toMatch(/^"[A-Za-z0-9_-]+"$/);
    expect(r.headers.get('cache-control')).toMatch(/public/);
    const again = await fetch(`${s.url}/api/openapi.json`, { headers: { 'if-none-match': etag! } });
    expect(again.status).toBe(304);
  });
});

describe('the worked examples (src/lib/docs/examples)', () => {
  /** The CSV rows a correct example writes, from the night API's own answer (same query). */
  async function expectedRows() {
    const night = await bearer(`/api/scenes/${sceneId}/night?step=10`);
    expect(night.status).toBe(200);
    expect(night.data.targets.length).toBeGreaterThan(0);
    return night.data.targets.flatMap((t: any) => t.samples.map((x: any) => [t.name, x.time, x.altitude, x.azimuth, x.airmass]));
  }

  function readCsv(path: string) {
    const parsed = Papa.parse<string[]>(readFileSync(path, 'utf8'), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [head, ...rows] = parsed.data;
    expect(head).toEqual(['target', 'time', 'altitude', 'azimuth', 'airmass']);
    return rows.map(([name, time, alt, az, airmass]) => [name, time, Number(alt), Number(az), airmass === '' ? null : Number(airmass)]);
  }

  const env = () => ({ ...process.env, ARMILLA_URL: s.url, ARMILLA_TOKEN: token });

  test('Python (standard library only) writes the night API’s numbers to CSV', async () => {
    const out = join(dir, 'night-python.csv');
    await run('/usr/bin/python3', ['-I', join(EXAMPLES, 'night-to-csv.py'), sceneId, out], { env: env(), timeout: 60_000 });
    const want = await expectedRows();
    expect(want.length).toBeGreaterThan(10);
    expect(readCsv(out)).toEqual(want);
  });

  test('the Python example reports a refused token and writes nothing', async () => {
    const out = join(dir, 'refused.csv');
    const r = await run('/usr/bin/python3', ['-I', join(EXAMPLES, 'night-to-csv.py'), sceneId, out], {
      env: { ...env(), ARMILLA_TOKEN: `arm_${'x'.repeat(43)}` },
      timeout: 60_000,
    }).catch((e: { code: number; stderr: string }) => e);
    expect((r as { code: number }).code).toBe(1);
    expect((r as { stderr: string }).stderr).toMatch(/^401: /);
    expect(() => readFileSync(out)).toThrow();
  });

  const hasCurlAndJq = (() => {
    try {
      execFileSync('bash', ['-c', 'command -v curl && command -v jq'], { stdio: 'ignore' });
      return true;
    } catch {
      return false;
    }
  })();

  test.skipIf(!hasCurlAndJq)('curl + jq writes the same CSV', async () => {
    const out = join(dir, 'night-curl.csv');
    await run('bash', [join(EXAMPLES, 'night-to-csv.sh'), sceneId, out], { env: env(), timeout: 60_000 });
    expect(readCsv(out)).toEqual(await expectedRows());
  });
});

describe('GET /docs/api', () => {
  test('renders every operation with its method and path, and both examples as they are in the tree', async () => {
    const r = await fetch(`${s.url}/docs/api`);
    expect(r.status).toBe(200);
    expect(r.headers.get('content-type')).toMatch(/text\/html/);
    const html = await r.text();
    const text = html.replace(/<[^>]+>/g, '').replace(/&#39;/g, "'").replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&');
    for (const op of documentedOperations(doc)) {
      const [method, path] = op.split(' ');
      const id = doc.paths[path][method.toLowerCase()].operationId;
      expect(html, op).toContain(`id="${id}"`);
    }
    for (const f of ['night-to-csv.py', 'night-to-csv.sh']) {
      const source = readFileSync(join(EXAMPLES, f), 'utf8').trim();
      expect(text, f).toContain(source);
    }
  });
});
