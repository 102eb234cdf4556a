/**
 * Team envelopes and sites. Field names of the envelope JSON are fixed by the API contract
 * ("Envelopes (pointing limits)"); the demo envelope's values come from the seed brief
 * (altitude 20°–87° as at an 8 m alt-az, ESO Paranal "At the telescope", via /work/shared/domain-facts.md).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';

let s: TestServer;
const as: Record<string, ApiClient> = {};
let teamId = '';
let otherTeamId = '';

const site = { name: 'Test site', lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' };
const limits = { name: 'Test limits', minAltitude: 15, maxAltitude: 85, azimuthRanges: [[300, 60]], keyholeRadius: 2, sunAvoidance: 30, moonAvoidance: 9 };

beforeAll(async () => {
  s = await startServer();
  for (const who of ['owner', 'editor', 'reviewer', 'viewer', 'outsider'] as const) {
    as[who] = new ApiClient(s.url);
    await as[who].signIn(DEMO[who]);
  }
  as.anon = new ApiClient(s.url);
  teamId = (await as.editor.get('/api/me')).data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
  otherTeamId = (await as.outsider.get('/api/me')).data.teams[0].id;
});
afterAll(() => s?.stop());

describe('GET /api/teams/:teamId/envelopes', () => {
  test('the demo envelope with the contract’s field names and values', async () => {
    const r = await as.viewer.get(`/api/teams/${teamId}/envelopes`);
    expect(r.status).toBe(200);
    const e = r.data.envelopes.find((x: { name: string }) => x.name === '0.6 m alt-az limits');
    expect(e).toMatchObject({
      id: expect.any(String),
      teamId,
      minAltitude: 20,
      maxAltitude: 87,
      keyholeRadius: 3,
      sunAvoidance: 45,
      moonAvoidance: 10,
      azimuthRanges: [[0, 360]],
      hourAngleLimits: [-5.5, 5.5],
      declinationLimits: [-35, 75],
      usedBy: 1,
    });
    expect(e.horizonMask.length).toBeGreaterThanOrEqual(10);
    for (const [az, alt] of e.horizonMask) {
      expect(az).toBeGreaterThanOrEqual(0);
      expect(az).toBeLessThanOrEqual(360);
      expect(alt).toBeGreaterThanOrEqual(0);
    }
  });

  test('401 anonymous; 404 for another team', async () => {
    expect((await as.anon.get(`/api/teams/${teamId}/envelopes`)).status).toBe(401);
    expect((await as.outsider.get(`/api/teams/${teamId}/envelopes`)).status).toBe(404);
  });
});

describe('POST /api/teams/:teamId/envelopes', () => {
  test('201 with the JSON as sent (an azimuth range may wrap through north)', async () => {
    const r = await as.editor.post(`/api/teams/${teamId}/envelopes`, {
      ...limits,
      horizonMask: [[0, 5], [90, 10], [180, 5], [270, 12]],
      hourAngleLimits: [-5.48, 5.23], // Lick Nickel: −5h29m / +5h14m (domain facts)
      declinationLimits: [-31.18, 64.1],
    });
    expect(r.status).toBe(201);
    expect(r.data.envelope).toMatchObject({ ...limits, hourAngleLimits: [-5.48, 5.23], id: expect.any(String), teamId });
    const list = (await as.viewer.get(`/api/teams/${teamId}/envelopes`)).data.envelopes;
    expect(list.map((x: { id: string }) => x.id)).toContain(r.data.envelope.id);
  });

  test.each([
    [{ minAltitude: 10 }, 'name'],
    [{ name: '  ' }, 'name'],
    [{ name: 'x', minAltitude: 95 }, 'minAltitude'],
    [{ name: 'x', minAltitude: 50, maxAltitude: 40 }, 'maxAltitude'],
    [{ name: 'x', azimuthRanges: [[0, 400]] }, 'azimuthRanges.0.1'],
    [{ name: 'x', horizonMask: [[400, 5]] }, 'horizonMask.0.0'],
    [{ name: 'x', horizonMask: [[10, 5, 3]] }, 'horizonMask.0'],
    [{ name: 'x', hourAngleLimits: [3, -3] }, 'hourAngleLimits'],
    [{ name: 'x', declinationLimits: [-100, 10] }, 'declinationLimits.0'],
    [{ name: 'x', sunAvoidance: 'lots' }, 'sunAvoidance'],
    [{ name: 'x', keyholeRadius: -1 }, 'keyholeRadius'],
    [{ name: 'x', elevationFloor: 10 }, 'elevationFloor'],
  ])('400 naming the field, nothing written: %j', async (body, field) => {
    const before = (await as.editor.get(`/api/teams/${teamId}/envelopes`)).data.envelopes.length;
    const r = await as.editor.post(`/api/teams/${teamId}/envelopes`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect((await as.editor.get(`/api/teams/${teamId}/envelopes`)).data.envelopes.length).toBe(before);
  });

  test('401 anonymous, 403 viewer and reviewer, 404 another team', async () => {
    expect((await as.anon.post(`/api/teams/${teamId}/envelopes`, limits)).status).toBe(401);
    expect((await as.viewer.post(`/api/teams/${teamId}/envelopes`, limits)).status).toBe(403);
    expect((await as.reviewer.post(`/api/teams/${teamId}/envelopes`, limits)).status).toBe(403);
    expect((await as.outsider.post(`/api/teams/${teamId}/envelopes`, limits)).status).toBe(404);
    expect((await as.editor.post(`/api/teams/${otherTeamId}/envelopes`, limits)).status).toBe(404);
  });
});

describe('PATCH/DELETE /api/envelopes/:id', () => {
  test('a change shows in every scene that uses the envelope', async () => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, limits)).data.envelope;
    const a = (await as.editor.post('/api/scenes', { teamId, title: 'A', site, time: '2026-03-20T19:30:00Z', envelopeId: env.id })).data.scene;
    const b = (await as.editor.post('/api/scenes', { teamId, title: 'B', site, time: '2026-03-20T19:30:00Z', envelopeId: env.id })).data.scene;
    const r = await as.editor.patch(`/api/envelopes/${env.id}`, { minAltitude: 25, moonAvoidance: null });
    expect(r.status).toBe(200);
    expect(r.data.envelope.minAltitude).toBe(25);
    expect(r.data.envelope).not.toHaveProperty('moonAvoidance');
    for (const sc of [a, b]) {
      const g = (await as.viewer.get(`/api/scenes/${sc.id}`)).data.scene;
      expect(g.envelopeId).toBe(env.id);
      expect(g.envelope.minAltitude).toBe(25);
      expect(g.envelope).not.toHaveProperty('moonAvoidance');
      expect(g.version).toBe(1);
    }
    expect((await as.editor.get(`/api/envelopes/${env.id}`)).data.envelope.minAltitude).toBe(25);
  });

  test('the fetched envelope can be sent back whole; renaming works', async () => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, limits)).data.envelope;
    const r = await as.owner.patch(`/api/envelopes/${env.id}`, { ...env, name: 'Renamed limits' });
    expect(r.status).toBe(200);
    expect(r.data.envelope.name).toBe('Renamed limits');
  });

  test.each([
    [{ minAltitude: 91 }, 'minAltitude'],
    [{ maxAltitude: 10 }, 'maxAltitude'], // below the stored minAltitude 15
    [{ name: '' }, 'name'],
    [{ horizonMask: 'flat' }, 'horizonMask'],
    [{ wobble: 1 }, 'wobble'],
  ])('400 naming the field and nothing changed: %j', async (body, field) => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, limits)).data.envelope;
    const r = await as.editor.patch(`/api/envelopes/${env.id}`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect((await as.editor.get(`/api/envelopes/${env.id}`)).data.envelope).toEqual(env);
  });

  test('401, 403 viewer/reviewer, 404 another team and unknown id', async () => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, limits)).data.envelope;
    expect((await as.anon.patch(`/api/envelopes/${env.id}`, { minAltitude: 1 })).status).toBe(401);
    expect((await as.viewer.patch(`/api/envelopes/${env.id}`, { minAltitude: 1 })).status).toBe(403);
    expect((await as.reviewer.patch(`/api/envelopes/${env.id}`, { minAltitude: 1 })).status).toBe(403);
    expect((await as.outsider.patch(`/api/envelopes/${env.id}`, { minAltitude: 1 })).status).toBe(404);
    expect((await as.outsider.get(`/api/envelopes/${env.id}`)).status).toBe(404);
    expect((await as.outsider.del(`/api/envelopes/${env.id}`)).status).toBe(404);
    expect((await as.viewer.del(`/api/envelopes/${env.id}`)).status).toBe(403);
    expect((await as.anon.del(`/api/envelopes/${env.id}`)).status).toBe(401);
    expect((await as.editor.patch('/api/envelopes/nope', { minAltitude: 1 })).status).toBe(404);
  });

  test('DELETE → 204; scenes that used it keep its last limits inline', async () => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, limits)).data.envelope;
    const sc = (await as.editor.post('/api/scenes', { teamId, title: 'Keeps limits', site, time: '2026-03-20T19:30:00Z', envelopeId: env.id })).data.scene;
    expect((await as.editor.del(`/api/envelopes/${env.id}`)).status).toBe(204);
    expect((await as.editor.get(`/api/envelopes/${env.id}`)).status).toBe(404);
    const g = (await as.editor.get(`/api/scenes/${sc.id}`)).data.scene;
    expect(g.envelopeId).toBeNull();
    expect(g.envelope).toMatchObject(limits);
  });

  test('envelope changes are in the activity log', async () => {
    const env = (await as.editor.post(`/api/teams/${teamId}/envelopes`, limits)).data.envelope;
    await as.editor.patch(`/api/envelopes/${env.id}`, { minAltitude: 16 });
    await as.editor.del(`/api/envelopes/${env.id}`);
    const acts = (await as.viewer.get(`/api/teams/${teamId}/activity`)).data.activity.filter((a: { subjectId: string }) => a.subjectId === env.id);
    expect(acts.map((a: { action: string }) => a.action)).toEqual(['envelope.delete', 'envelope.update', 'envelope.create']);
  });
});

describe('sites', () => {
  test('the demo has two sites of the team', async () => {
    const r = await as.viewer.get(`/api/teams/${teamId}/sites`);
    expect(r.status).toBe(200);
    const names = r.data.sites.map((x: { name: string }) => x.name);
    expect(names).toEqual(expect.arrayContaining(['Larkspur Ridge summit', 'Larkspur visitor centre']));
    const summit = r.data.sites.find((x: { name: string }) => x.name === 'Larkspur Ridge summit');
    expect(summit).toMatchObject({ lat: 38.912, lon: -106.254, height: 3120, timeZone: 'America/Denver' });
  });

  test('POST 201, PATCH 200, DELETE 204', async () => {
    const c = await as.editor.post(`/api/teams/${teamId}/sites`, site);
    expect(c.status).toBe(201);
    expect(c.data.site).toMatchObject({ ...site, id: expect.any(String), teamId });
    const p = await as.editor.patch(`/api/sites/${c.data.site.id}`, { height: 3000, name: 'Lower pad' });
    expect(p.status).toBe(200);
    expect(p.data.site).toMatchObject({ height: 3000, name: 'Lower pad', lat: 38.912 });
    expect((await as.editor.del(`/api/sites/${c.data.site.id}`)).status).toBe(204);
    expect((await as.editor.get(`/api/sites/${c.data.site.id}`)).status).toBe(404);
  });

  test('height and time zone default to 0 m and UTC', async () => {
    const c = await as.editor.post(`/api/teams/${teamId}/sites`, { name: 'Sea level', lat: 0, lon: 0 });
    expect(c.data.site).toMatchObject({ height: 0, timeZone: 'UTC' });
  });

  test.each([
    [{ ...site, lat: 91 }, 'lat'],
    [{ ...site, lon: 180.5 }, 'lon'],
    [{ ...site, timeZone: 'Mars/Olympus_Mons' }, 'timeZone'],
    [{ ...site, name: '' }, 'name'],
    [{ ...site, lat: '38.9' }, 'lat'],
    [{ ...site, elevation: 3 }, 'elevation'],
  ])('POST 400 naming the field, nothing written: %j', async (body, field) => {
    const before = (await as.editor.get(`/api/teams/${teamId}/sites`)).data.sites.length;
    const r = await as.editor.post(`/api/teams/${teamId}/sites`, body);
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe(field);
    expect((await as.editor.get(`/api/teams/${teamId}/sites`)).data.sites.length).toBe(before);
  });

  test('PATCH 400 naming the field and unchanged', async () => {
    const c = (await as.editor.post(`/api/teams/${teamId}/sites`, site)).data.site;
    const r = await as.editor.patch(`/api/sites/${c.id}`, { lat: -91 });
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('lat');
    expect((await as.editor.get(`/api/sites/${c.id}`)).data.site).toEqual(c);
  });

  test('401, 403 viewer/reviewer, 404 another team', async () => {
    const c = (await as.editor.post(`/api/teams/${teamId}/sites`, site)).data.site;
    expect((await as.anon.post(`/api/teams/${teamId}/sites`, site)).status).toBe(401);
    expect((await as.anon.get(`/api/teams/${teamId}/sites`)).status).toBe(401);
    expect((await as.viewer.post(`/api/teams/${teamId}/sites`, site)).status).toBe(403);
    expect((await as.reviewer.patch(`/api/sites/${c.id}`, { height: 1 })).status).toBe(403);
    expect((await as.viewer.del(`/api/sites/${c.id}`)).status).toBe(403);
    expect((await as.outsider.get(`/api/teams/${teamId}/sites`)).status).toBe(404);
    expect((await as.outsider.patch(`/api/sites/${c.id}`, { height: 1 })).status).toBe(404);
    expect((await as.outsider.del(`/api/sites/${c.id}`)).status).toBe(404);
    expect((await as.anon.patch(`/api/sites/${c.id}`, { height: 1 })).status).toBe(401);
  });

  test('deleting a site leaves scenes made from it unchanged (they keep a copy)', async () => {
    const c = (await as.editor.post(`/api/teams/${teamId}/sites`, { ...site, name: 'Temporary' })).data.site;
    const sc = (await as.editor.post('/api/scenes', { teamId, title: 'From temp', siteId: c.id, time: '2026-03-20T19:30:00Z' })).data.scene;
    await as.editor.del(`/api/sites/${c.id}`);
    const g = (await as.editor.get(`/api/scenes/${sc.id}`)).data.scene;
    expect(g.site.name).toBe('Temporary');
  });
});
