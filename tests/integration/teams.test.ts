/**
 * Teams, roles and invitations against the built server, a temp-file database and an SMTP fake.
 * Expected behaviour is the API contract (/work/shared/api-contract.md, "Teams").
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { sql } from 'drizzle-orm';
import { openDb } from '../../src/lib/server/db/client';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { startMailFake, type MailFake } from './helpers/mail';

let s: TestServer;
let mail: MailFake;
const as: Record<keyof typeof DEMO, ApiClient> = {} as never;
let teamId: string;
let otherTeamId: string;
const ids: Record<string, string> = {};

beforeAll(async () => {
  mail = await startMailFake();
  s = await startServer({ env: { SMTP_URL: mail.smtpUrl } });
  for (const who of ['owner', 'editor', 'reviewer', 'viewer', 'outsider'] as const) {
    as[who] = new ApiClient(s.url);
    await as[who].signIn(DEMO[who]);
    const me = await as[who].get('/api/me');
    ids[who] = me.data.user.id;
    if (who === 'owner') teamId = me.data.teams[0].id;
    if (who === 'outsider') otherTeamId = me.data.teams[0].id;
  }
});
afterAll(async () => {
  await s?.stop();
  await mail?.stop();
});

const members = (c: ApiClient, team = teamId) => c.get(`/api/teams/${team}/members`);

async function auditActions(team: string): Promise<string[]> {
  const db = await openDb(s.dbUrl);
  try {
    const rows = await db.all<{ action: string }>(sql`select action from audit_log where team_id = ${team} order by at`);
    return rows.map((row) => String(row.action));
  } finally {
    db.close();
  }
}

describe('the demo world', () => {
  test('four members in Larkspur Ridge Observatory with the contract roles; the outsider owns another team', async () => {
    const r = await members(as.viewer);
    expect(r.status).toBe(200);
    const byEmail = Object.fromEntries(r.data.members.map((m: { email: string; role: string }) => [m.email, m.role]));
    expect(byEmail).toEqual({ [DEMO.owner]: 'owner', [DEMO.editor]: 'editor', [DEMO.reviewer]: 'reviewer', [DEMO.viewer]: 'viewer' });
    const out = await as.outsider.get('/api/me');
    expect(out.data.teams).toEqual([{ id: otherTeamId, name: 'Elsewhere Skywatchers', role: 'owner' }]);
  });
});

describe('members', () => {
  test('401 without a session; 404 for a team the caller is not in (never 403)', async () => {
    expect((await members(new ApiClient(s.url))).status).toBe(401);
    const r = await members(as.outsider);
    expect(r.status).toBe(404);
    expect((await members(as.owner, 'no-such-team')).status).toBe(404);
  });

  test('only owners change roles: editor → 403, outsider → 404, bad role → 400 naming the field', async () => {
    expect((await as.editor.patch(`/api/teams/${teamId}/members/${ids.viewer}`, { role: 'editor' })).status).toBe(403);
    expect((await as.outsider.patch(`/api/teams/${teamId}/members/${ids.viewer}`, { role: 'editor' })).status).toBe(404);
    const bad = await as.owner.patch(`/api/teams/${teamId}/members/${ids.viewer}`, { role: 'admin' });
    expect(bad.status).toBe(400);
    expect(bad.data.error.field).toBe('role');
    expect((await as.owner.patch(`/api/teams/${teamId}/members/${ids.outsider}`, { role: 'viewer' })).status).toBe(404);
  });

  test('an owner changes a role; the change shows in /api/me and in the audit log', async () => {
    const r = await as.owner.patch(`/api/teams/${teamId}/members/${ids.reviewer}`, { role: 'editor' });
    expect(r.status).toBe(200);
    expect(r.data.member).toMatchObject({ userId: ids.reviewer, role: 'editor' });
    expect((await as.reviewer.get('/api/me')).data.teams[0].role).toBe('editor');
    expect((await as.owner.patch(`/api/teams/${teamId}/members/${ids.reviewer}`, { role: 'reviewer' })).status).toBe(200);
    const log = await auditActions(teamId);
    expect(log.filter((a) => a === 'member.role')).toHaveLength(2);
  });

  test('the last owner can neither step down nor leave (409 last_owner)', async () => {
    const demote = await as.outsider.patch(`/api/teams/${otherTeamId}/members/${ids.outsider}`, { role: 'editor' });
    expect(demote.status).toBe(409);
    expect(demote.data.error.code).toBe('last_owner');
    const leave = await as.outsider.del(`/api/teams/${otherTeamId}/members/${ids.outsider}`);
    expect(leave.status).toBe(409);
    expect(leave.data.error.code).toBe('last_owner');
    expect((await as.outsider.get('/api/me')).data.teams).toHaveLength(1);
  });

  test('with a second owner, an owner may leave', async () => {
    const created = await as.editor.post('/api/teams', { name: 'Dome Crew' });
    expect(created.status).toBe(201);
    expect(created.data.team).toMatchObject({ name: 'Dome Crew', role: 'owner' });
    const dome = created.data.team.id as string;
    // Bring the viewer in through an invitation, then make them an owner.
    await as.editor.post(`/api/teams/${dome}/invitations`, { email: DEMO.viewer, role: 'viewer' });
    const m = await mail.waitFor(DEMO.viewer, /invitation to a team/);
    expect(m.text).toContain('Dome Crew');
    const token = m.text.match(/\/invitations\/([A-Za-z0-9_-]+)/)![1]!;
    expect((await as.viewer.post(`/api/invitations/${token}/accept`)).status).toBe(200);
    expect((await as.editor.patch(`/api/teams/${dome}/members/${ids.viewer}`, { role: 'owner' })).status).toBe(200);
    expect((await as.editor.del(`/api/teams/${dome}/members/${ids.editor}`)).status).toBe(204);
    expect((await members(as.editor, dome)).status).toBe(404);
    const left = await members(as.viewer, dome);
    expect(left.data.members.map((x: { role: string }) => x.role)).toEqual(['owner']);
    expect(await auditActions(dome)).toEqual(['team.create', 'member.invite', 'member.join', 'member.role', 'member.leave']);
  });

  test('POST /api/teams without a name → 400 naming the field', async () => {
    const r = await as.viewer.post('/api/teams', { name: '' });
    expect(r.status).toBe(400);
    expect(r.data.error.field).toBe('name');
  });
});

describe('invitations', () => {
  test('owner only: editor → 403, outsider → 404, bad fields → 400 naming them', async () => {
    expect((await as.editor.post(`/api/teams/${teamId}/invitations`, { email: 'x@test.example', role: 'viewer' })).status).toBe(403);
    expect((await as.outsider.post(`/api/teams/${teamId}/invitations`, { email: 'x@test.example', role: 'viewer' })).status).toBe(404);
    const badRole = await as.owner.post(`/api/teams/${teamId}/invitations`, { email: 'x@test.example', role: 'captain' });
    expect(badRole.status).toBe(400);
    expect(badRole.data.error.field).toBe('role');
    const badMail = await as.owner.post(`/api/teams/${teamId}/invitations`, { email: 'nope', role: 'viewer' });
    expect(badMail.status).toBe(400);
    expect(badMail.data.error.field).toBe('email');
    const member = await as.owner.post(`/api/teams/${teamId}/invitations`, { email: DEMO.editor, role: 'viewer' });
    expect(member.status).toBe(409);
    expect(member.data.error.code).toBe('already_member');
  });

  test('the mail arrives at the SMTP fake; a new person signs up and accepting grants the role; the link works once', async () => {
    const invitee = `newcomer-${Date.now().toString(36)}@test.example`;
    const r = await as.owner.post(`/api/teams/${teamId}/invitations`, { email: invitee, role: 'reviewer' });
    expect(r.status).toBe(201);
    expect(r.data).toMatchObject({ mailed: true, invitation: { email: invitee, role: 'reviewer' } });
    expect(JSON.stringify(r.data)).not.toMatch(/token/i);

    const m = await mail.waitFor(invitee, /invitation to a team/);
    // Names chosen by users (the inviter's, the team's) stay out of the subject (issue 17 finding 6).
    expect(m.subject).toBe('An invitation to a team on Armilla');
    expect(m.text).toContain('Larkspur Ridge Observatory');
    const link = m.text.match(/(https?:\/\/\S+)\/invitations\/([A-Za-z0-9_-]+)/);
    expect(link, m.text).not.toBeNull();
    expect(link![1]).toBe(s.url);
    expect(m.html).toContain(link![0]);
    const token = link![2]!;

    const pending = await as.owner.get(`/api/teams/${teamId}/invitations`);
    expect(pending.data.invitations.map((i: { email: string }) => i.email)).toContain(invitee);

    // The invitation page names the team for a signed-out visitor.
    const page = await new ApiClient(s.url).request('GET', `/invitations/${token}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('Larkspur Ridge Observatory');

    // Someone else cannot use a forwarded link.
    const wrong = await as.outsider.post(`/api/invitations/${token}/accept`);
    expect(wrong.status).toBe(403);
    expect(wrong.data.error.code).toBe('wrong_account');
    expect((await new ApiClient(s.url).post(`/api/invitations/${token}/accept`)).status).toBe(401);

    const newcomer = new ApiClient(s.url);
    expect((await newcomer.post('/api/auth/sign-up', { email: invitee, password: 'newcomer password', name: 'Nell Newcomer', personalTeam: false })).status).toBe(201);
    // Signing up with the address proves nothing: the link mailed to it must be opened first.
    const unverified = await newcomer.post(`/api/invitations/${token}/accept`);
    expect(unverified.status).toBe(403);
    expect(unverified.data.error.code).toBe('email_unverified');
    expect((await newcomer.get('/api/me')).data.emailVerified).toBe(false);
    const vm = await mail.waitFor(invitee, /Confirm your e-mail address/);
    const verify = vm.text.match(/https?:\/\/\S+\/verify\/([A-Za-z0-9_-]+)/);
    expect(verify, vm.text).not.toBeNull();
    expect((await new ApiClient(s.url).request('GET', `/verify/${verify![1]}`)).status).toBe(200);
    expect((await new ApiClient(s.url).request('GET', `/verify/${verify![1]}`)).status).toBe(404);
    expect((await newcomer.get('/api/me')).data.emailVerified).toBe(true);
    const accepted = await newcomer.post(`/api/invitations/${token}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.data.team).toEqual({ id: teamId, name: 'Larkspur Ridge Observatory', role: 'reviewer' });
    expect((await newcomer.get('/api/me')).data.teams).toEqual([{ id: teamId, name: 'Larkspur Ridge Observatory', role: 'reviewer' }]);
    const list = await members(as.owner);
    expect(list.data.members.find((x: { email: string }) => x.email === invitee)?.role).toBe('reviewer');

    expect((await newcomer.post(`/api/invitations/${token}/accept`)).status).toBe(404);
    expect((await new ApiClient(s.url).request('GET', `/invitations/${token}`)).status).toBe(404);
  });

  test('an owner withdraws a pending invitation and its link stops working', async () => {
    const invitee = `withdrawn-${Date.now().toString(36)}@test.example`;
    const r = await as.owner.post(`/api/teams/${teamId}/invitations`, { email: invitee, role: 'viewer' });
    const m = await mail.waitFor(invitee);
    const token = m.text.match(/\/invitations\/([A-Za-z0-9_-]+)/)![1]!;
    expect((await as.editor.del(`/api/teams/${teamId}/invitations/${r.data.invitation.id}`)).status).toBe(403);
    expect((await as.owner.del(`/api/teams/${teamId}/invitations/${r.data.invitation.id}`)).status).toBe(204);
    const c = new ApiClient(s.url);
    await c.post('/api/auth/sign-up', { email: invitee, password: 'withdrawn password', name: 'W' });
    expect((await c.post(`/api/invitations/${token}/accept`)).status).toBe(404);
  });
});

describe('removing members', () => {
  test('an owner removes the viewer: the team disappears from their /api/me and its members answer 404', async () => {
    expect((await as.viewer.del(`/api/teams/${teamId}/members/${ids.editor}`)).status).toBe(403);
    expect((await as.owner.del(`/api/teams/${teamId}/members/${ids.viewer}`)).status).toBe(204);
    expect((await as.viewer.get('/api/me')).data.teams.map((t: { id: string }) => t.id)).not.toContain(teamId);
    expect((await members(as.viewer)).status).toBe(404);
    expect((await as.owner.del(`/api/teams/${teamId}/members/${ids.viewer}`)).status).toBe(404);
    expect(await auditActions(teamId)).toContain('member.remove');
  });
});
