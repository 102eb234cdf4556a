/**
 * Every operation a personal API token can reach (contracts/token-access.ts), one entry per route file
 * and method under src/pages/api, with the zod schemas the route itself validates with. document.ts
 * turns this list into the OpenAPI 3.1 document; tests/integration/openapi.test.ts fails when a route
 * file and this list disagree. To describe a new route: add its entry here, importing the schema the
 * route parses with (never a copy of it).
 */
import { z, type ZodTypeAny } from 'zod';
import type { Role } from '../../contracts/roles';
import { activityQuerySchema, meSchema } from '../../contracts/team';
import { siteCreateSchema, sitePatchSchema } from '../../contracts/site';
import { envelopeCreateSchema, envelopePatchSchema } from '../../contracts/envelope';
import { restoreSchema, sceneCreateSchema, sceneListQuerySchema, sceneOutSchema, scenePatchSchema } from '../../contracts/scene';
import { ROLES } from '../../contracts/roles';
import { anchorSchema, commentCreateSchema, commentPatchSchema, guestCommentSchema } from '../../contracts/comment';
import { cameraSchema, layersSchema, pinSchema, siteSchema, stepSchema, targetSchema } from '../../contracts/scene-doc';
import { envelopeSchema } from '../../contracts/envelope';
import { linkCreateSchema } from '../../contracts/link';
import { presenterSchema } from '../../contracts/presenter';
import { placeSchema, placesQuerySchema, placesResponseSchema, zoneQuerySchema, zoneResponseSchema } from '../../contracts/places';
import { nightAnswerSchema } from '../../contracts/night';
import { nightQuerySchema } from '../../night/query';
import { HORIZON_CONVENTIONS } from '../../imports/horizon-csv';
import { sceneFileSchema } from '../../exports/scene-json';
import { profileInput } from '../accounts';
import { invitationInput, roleInput, teamInput } from '../teams';
import { positionsQuerySchema, windowsCsvQuerySchema } from '../exports/responses';
import { eventsAnswerSchema, eventsQuerySchema, observeAnswerSchema, observeQuerySchema, windowsAnswerSchema, windowsBodySchema } from '../sky-api';

/**
 * Schemas that several operations share, described once under `components.schemas` by these names and
 * referred to elsewhere. Inner ones first: a later one refers to an earlier one it contains.
 */
export const NAMED_SCHEMAS: [ZodTypeAny, string][] = [
  [siteSchema, 'Site'],
  [cameraSchema, 'Camera'],
  [layersSchema, 'Layers'],
  [targetSchema, 'Target'],
  [pinSchema, 'Pin'],
  [stepSchema, 'Step'],
  [envelopeSchema, 'Envelope'],
  [anchorSchema, 'Anchor'],
  [sceneFileSchema, 'SceneFile'],
  [sceneOutSchema, 'Scene'],
  [nightAnswerSchema, 'NightAnswer'],
  [placeSchema, 'Place'],
];

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Groups of the API page, in the order it shows them. */
export const TAGS = [
  { name: 'Scenes', description: 'Scenes of your teams: create, read, change, delete, history and thumbnails.' },
  { name: 'Night and exports', description: "A scene's night in numbers, and its files: CSV, VOTable, scene JSON, SVG chart, iCalendar." },
  { name: 'Review', description: 'Comments on a scene and the presenter of a briefing.' },
  { name: 'Share links', description: 'Links for people without an account, and what a link holder can read.' },
  { name: 'Sites and envelopes', description: "A team's saved sites and pointing limits (envelopes)." },
  { name: 'Teams', description: 'Teams, members, invitations, activity and the calendar subscription.' },
  { name: 'Sky computation', description: 'Positions, events and visibility windows for any site: no account needed, rate limited.' },
  { name: 'Places', description: 'Town search over the offline gazetteer and the time zone at a point.' },
  { name: 'Service', description: 'Your account, the service health and this description.' },
] as const;
export type Tag = (typeof TAGS)[number]['name'];

/**
 * Who may call: `anyone` (no account; a token is optional), `signed-in` (any account), a team role and
 * above (the scene's or team's role of the caller), or `link` (the holder of a share link in the path).
 */
export type Who = 'anyone' | 'signed-in' | Role | 'link';

export interface Operation {
  method: Method;
  /** OpenAPI path template: `/api/scenes/{id}/night`. */
  path: string;
  tag: Tag;
  summary: string;
  description?: string;
  who: Who;
  /** Query-string schema the route parses with. */
  query?: ZodTypeAny;
  body?: { schema: ZodTypeAny; type?: 'application/json' | 'multipart/form-data' | 'image/png'; description?: string };
  ok: { status: number; description: string; schema?: ZodTypeAny; type?: string };
  /** 4xx answers besides the ones every operation of its kind has (document.ts adds those). */
  errors?: number[];
}

// Bodies that are not JSON validated by a zod schema: the multipart and binary uploads.
const fileField = z.string().describe('the file (binary)');
const csvUpload = z.object({ file: fileField });
const horizonUpload = z.object({
  file: fileField.describe('CSV with columns azimuth,elevation'),
  convention: z.enum(HORIZON_CONVENTIONS).optional().describe('azimuth convention: north-east (default), south (from south through west) or signed (−180..180, east +)'),
});
const sceneImportJson = z.object({ teamId: z.string().describe('the team that receives the new scene'), file: sceneFileSchema });
const sceneAnswer = z.object({ scene: sceneOutSchema });
const sceneWithRole = z.object({ scene: sceneOutSchema, role: z.enum(ROLES).describe('your role in its team') });
const png = z.string().describe('PNG image (binary)');

const CSV = 'text/csv';
const ICS = 'text/calendar';
const SVG = 'image/svg+xml';
const VOT = 'application/x-votable+xml';
const SSE = 'text/event-stream';

export const OPERATIONS: Operation[] = [
  // ---------- scenes ----------
  { method: 'get', path: '/api/scenes', tag: 'Scenes', who: 'signed-in', summary: "List your teams' scenes", description: 'Newest change first; `teamId` keeps one team.', query: sceneListQuerySchema, ok: { status: 200, description: '`{scenes: [{id, teamId, title, description, time, version, updatedAt, createdAt, siteName, createdBy}]}`' } },
  { method: 'post', path: '/api/scenes', tag: 'Scenes', who: 'editor', summary: 'Create a scene', description: 'Editor or owner of `teamId`. Give `site` or a saved `siteId`; `fromSceneId` duplicates a scene, the fields given override the copy.', body: { schema: sceneCreateSchema }, ok: { status: 201, description: '`{scene}` with `version: 1`', schema: sceneAnswer } },
  { method: 'post', path: '/api/scenes/import', tag: 'Scenes', who: 'editor', summary: 'Import a scene file', description: 'An `armilla-scene` file (format version 1) becomes a new scene of `teamId`: as JSON `{teamId, file}`, or multipart with fields `file` and `teamId`.', body: { schema: sceneImportJson }, ok: { status: 201, description: '`{scene}`', schema: sceneAnswer }, errors: [413, 415, 422] },
  { method: 'get', path: '/api/scenes/{id}', tag: 'Scenes', who: 'viewer', summary: 'Read a scene', ok: { status: 200, description: '`{scene, role}`: the scene document with its id, version and times, and your role in its team', schema: sceneWithRole } },
  { method: 'patch', path: '/api/scenes/{id}', tag: 'Scenes', who: 'editor', summary: 'Change a scene', description: 'Send `version` (the one you read) and the fields to change. A stale `version` answers 409 `version_conflict` with the current scene.', body: { schema: scenePatchSchema }, ok: { status: 200, description: '`{scene}` with the version increased by one', schema: sceneAnswer }, errors: [409, 413] },
  { method: 'delete', path: '/api/scenes/{id}', tag: 'Scenes', who: 'editor', summary: 'Delete a scene', ok: { status: 204, description: 'Deleted' } },
  { method: 'get', path: '/api/scenes/{id}/versions', tag: 'Scenes', who: 'viewer', summary: "A scene's history", ok: { status: 200, description: '`{versions: [{version, authorId, authorName, createdAt, title}], current}`, newest first' } },
  { method: 'post', path: '/api/scenes/{id}/versions/{n}/restore', tag: 'Scenes', who: 'editor', summary: 'Restore an earlier version', description: 'Makes a new version with the content of version `n`; an optional `version` guards against a stale view (409).', body: { schema: restoreSchema }, ok: { status: 200, description: '`{scene}`', schema: sceneAnswer }, errors: [409] },
  { method: 'get', path: '/api/scenes/{id}/thumbnail', tag: 'Scenes', who: 'viewer', summary: 'The preview image sent by the editor', ok: { status: 200, description: 'PNG', type: 'image/png', schema: png } },
  { method: 'put', path: '/api/scenes/{id}/thumbnail', tag: 'Scenes', who: 'editor', summary: 'Replace the preview image', description: 'A PNG of at most 2 MB (the signature is checked); the scene keeps its version.', body: { schema: png, type: 'image/png' }, ok: { status: 204, description: 'Stored' }, errors: [413, 415] },
  { method: 'get', path: '/api/scenes/{id}/thumbnail.png', tag: 'Scenes', who: 'viewer', summary: "The scene's thumbnail, drawn by the server", ok: { status: 200, description: 'PNG', type: 'image/png', schema: png } },
  { method: 'post', path: '/api/scenes/{id}/targets/import', tag: 'Scenes', who: 'editor', summary: 'Add targets from a CSV file', description: 'Multipart field `file`: UTF-8, RFC 4180, columns name, ra, dec and optionally epoch, pmra, pmdec, notes. Any bad row: 422 with `rows: [{line, field, message}]` and nothing is added.', body: { schema: csvUpload, type: 'multipart/form-data' }, ok: { status: 200, description: '`{added}`' }, errors: [413, 415, 422] },
  { method: 'post', path: '/api/scenes/{id}/targets/preview', tag: 'Scenes', who: 'editor', summary: 'Check a target CSV without adding it', body: { schema: csvUpload, type: 'multipart/form-data' }, ok: { status: 200, description: '`{rows: [{line, name, ra, dec, errors}], valid}`' }, errors: [413, 415] },

  // ---------- night and exports ----------
  { method: 'get', path: '/api/scenes/{id}/night', tag: 'Night and exports', who: 'viewer', summary: "The scene's night in numbers", description: "Sun events and twilights, the Moon, and for each target its altitude, azimuth and airmass every `step` minutes, its windows inside the scene's envelope and its best moment. Default span: the night around the scene time (sunset to sunrise); at most 36 h.", query: nightQuerySchema, ok: { status: 200, description: 'The night', schema: nightAnswerSchema } },
  { method: 'get', path: '/api/scenes/{id}/night.svg', tag: 'Night and exports', who: 'viewer', summary: 'The altitude chart as SVG', description: 'The same query as the night numbers; paper inks.', query: nightQuerySchema, ok: { status: 200, description: 'SVG', type: SVG } },
  { method: 'get', path: '/api/scenes/{id}/export.csv', tag: 'Night and exports', who: 'viewer', summary: 'Target positions at one time (CSV)', description: 'One row a target at `time` (default the scene time): name, ra, dec, azimuth, altitude, airmass, next rise, transit and set, inside the envelope.', query: positionsQuerySchema, ok: { status: 200, description: 'CSV (RFC 4180)', type: CSV } },
  { method: 'get', path: '/api/scenes/{id}/windows.csv', tag: 'Night and exports', who: 'viewer', summary: 'Visibility windows (CSV)', description: "Each target's windows inside the scene's envelope from `from` to `to` (default 24 h from the scene time, at most 31 days).", query: windowsCsvQuerySchema, ok: { status: 200, description: 'CSV (RFC 4180)', type: CSV } },
  { method: 'get', path: '/api/scenes/{id}/export.json', tag: 'Night and exports', who: 'viewer', summary: 'The scene as a file', description: 'An `armilla-scene` file, format version 1 (JSON Schema at /schemas/armilla-scene-1.schema.json).', ok: { status: 200, description: 'The scene file', schema: sceneFileSchema } },
  { method: 'get', path: '/api/scenes/{id}/targets.vot', tag: 'Night and exports', who: 'viewer', summary: 'The targets as a VOTable', description: 'IVOA VOTable 1.4, ICRS, epoch J2000.', ok: { status: 200, description: 'VOTable', type: VOT } },
  { method: 'get', path: '/api/scenes/{id}/calendar.ics', tag: 'Night and exports', who: 'viewer', summary: 'The night as a calendar file', description: 'iCalendar (RFC 5545): Sun and Moon events, twilights, target windows and briefing steps, in UTC with the site zone named; stable UIDs, so a re-import updates.', ok: { status: 200, description: 'iCalendar', type: ICS } },

  // ---------- review ----------
  { method: 'get', path: '/api/scenes/{id}/comments', tag: 'Review', who: 'viewer', summary: "A scene's comments", ok: { status: 200, description: '`{comments: [{id, parentId, author, body, anchor, stepId, resolved, createdAt, …}]}`' } },
  { method: 'post', path: '/api/scenes/{id}/comments', tag: 'Review', who: 'reviewer', summary: 'Comment on a scene', description: 'Optionally pinned to the sky (`anchor` `{ra, dec}` or `{azimuth, altitude}`), to a point of the altitude chart, to a step, or answering a comment (`parentId`). Owners and editors get an e-mail.', body: { schema: commentCreateSchema }, ok: { status: 201, description: '`{comment}`' } },
  { method: 'patch', path: '/api/comments/{id}', tag: 'Review', who: 'reviewer', summary: 'Resolve or reopen a comment', body: { schema: commentPatchSchema }, ok: { status: 200, description: '`{comment}`' } },
  { method: 'get', path: '/api/scenes/{id}/presenter', tag: 'Review', who: 'viewer', summary: "The presenter's current step", ok: { status: 200, description: '`{presenter: {sceneId, stepIndex, stepId, time, updatedAt} | null}`' } },
  { method: 'post', path: '/api/scenes/{id}/presenter', tag: 'Review', who: 'editor', summary: 'Move every follower to a step', body: { schema: presenterSchema }, ok: { status: 200, description: '`{presenter}`' } },
  { method: 'get', path: '/api/scenes/{id}/presenter/stream', tag: 'Review', who: 'viewer', summary: 'Follow the presenter (server-sent events)', description: '`event: step` whenever the presenter moves; the stream ends when the scene or your membership goes.', ok: { status: 200, description: 'Event stream', type: SSE } },

  // ---------- share links ----------
  { method: 'get', path: '/api/scenes/{id}/links', tag: 'Share links', who: 'editor', summary: "A scene's share links", description: 'With their state; the token itself is never shown again.', ok: { status: 200, description: '`{links: [{id, role, createdAt, expiresAt, revokedAt, lastUsedAt, active}]}`' } },
  { method: 'post', path: '/api/scenes/{id}/links', tag: 'Share links', who: 'editor', summary: 'Make a share link', body: { schema: linkCreateSchema }, ok: { status: 201, description: '`{id, token, url}`: the only time the token is shown' } },
  { method: 'delete', path: '/api/scenes/{id}/links/{linkId}', tag: 'Share links', who: 'editor', summary: 'Revoke a share link', description: 'The token stops working at once.', ok: { status: 204, description: 'Revoked' } },
  { method: 'get', path: '/api/shared/{token}', tag: 'Share links', who: 'link', summary: 'The scene behind a link', description: 'Read-only; 404 for an unknown, revoked or expired link.', ok: { status: 200, description: '`{scene, role}`' } },
  { method: 'patch', path: '/api/shared/{token}', tag: 'Share links', who: 'link', summary: 'Refused: a link is read-only', description: 'Always 403 for a live link (404 for a dead one).', ok: { status: 403, description: 'A shared link is read-only' } },
  { method: 'put', path: '/api/shared/{token}', tag: 'Share links', who: 'link', summary: 'Refused: a link is read-only', description: 'Always 403 for a live link (404 for a dead one).', ok: { status: 403, description: 'A shared link is read-only' } },
  { method: 'delete', path: '/api/shared/{token}', tag: 'Share links', who: 'link', summary: 'Refused: a link is read-only', description: 'Always 403 for a live link (404 for a dead one).', ok: { status: 403, description: 'A shared link is read-only' } },
  { method: 'post', path: '/api/shared/{token}/links', tag: 'Share links', who: 'link', summary: 'Refused: a link cannot make links', description: 'Always 403 for a live link (404 for a dead one).', ok: { status: 403, description: 'Only editors of the team can share a scene' } },
  { method: 'get', path: '/api/shared/{token}/comments', tag: 'Share links', who: 'link', summary: 'Comments, through a reviewer link', description: '403 for a viewer link.', ok: { status: 200, description: '`{comments}`' } },
  { method: 'post', path: '/api/shared/{token}/comments', tag: 'Share links', who: 'link', summary: 'Comment through a reviewer link', description: 'No account: the comment carries `authorName`. 403 for a viewer link; rate limited per link and address.', body: { schema: guestCommentSchema }, ok: { status: 201, description: '`{comment}`' } },
  { method: 'get', path: '/api/shared/{token}/chart-comments', tag: 'Share links', who: 'link', summary: 'Comments pinned to the altitude chart, through any link', description: 'Viewer and reviewer links: the top-level comments with a chart anchor, as the chart shows them to everyone.', ok: { status: 200, description: '`{comments: [{id, target, time, body, author, resolved, createdAt}]}`' } },
  { method: 'get', path: '/api/shared/{token}/night', tag: 'Share links', who: 'link', summary: 'The night in numbers, through a link', query: nightQuerySchema, ok: { status: 200, description: 'The night', schema: nightAnswerSchema } },
  { method: 'get', path: '/api/shared/{token}/night.svg', tag: 'Share links', who: 'link', summary: 'The altitude chart as SVG, through a link', query: nightQuerySchema, ok: { status: 200, description: 'SVG', type: SVG } },
  { method: 'get', path: '/api/shared/{token}/export.csv', tag: 'Share links', who: 'link', summary: 'Target positions (CSV), through a link', query: positionsQuerySchema, ok: { status: 200, description: 'CSV (RFC 4180)', type: CSV } },
  { method: 'get', path: '/api/shared/{token}/export-windows.csv', tag: 'Share links', who: 'link', summary: 'Visibility windows (CSV), through a link', query: windowsCsvQuerySchema, ok: { status: 200, description: 'CSV (RFC 4180)', type: CSV } },
  { method: 'get', path: '/api/shared/{token}/export.json', tag: 'Share links', who: 'link', summary: 'The scene file, through a link', ok: { status: 200, description: 'The scene file', schema: sceneFileSchema } },
  { method: 'get', path: '/api/shared/{token}/export.vot', tag: 'Share links', who: 'link', summary: 'The targets as a VOTable, through a link', ok: { status: 200, description: 'VOTable', type: VOT } },
  { method: 'get', path: '/api/shared/{token}/calendar.ics', tag: 'Share links', who: 'link', summary: 'The night as a calendar file, through a link', ok: { status: 200, description: 'iCalendar', type: ICS } },
  { method: 'get', path: '/api/shared/{token}/presenter/stream', tag: 'Share links', who: 'link', summary: 'Follow the presenter, through a link', description: 'Server-sent events; the stream ends when the link is revoked or expires.', ok: { status: 200, description: 'Event stream', type: SSE } },

  // ---------- sites and envelopes ----------
  { method: 'get', path: '/api/teams/{teamId}/sites', tag: 'Sites and envelopes', who: 'viewer', summary: "A team's saved sites", ok: { status: 200, description: '`{sites: [{id, teamId, name, lat, lon, height, timeZone}]}`' } },
  { method: 'post', path: '/api/teams/{teamId}/sites', tag: 'Sites and envelopes', who: 'editor', summary: 'Save a site', body: { schema: siteCreateSchema }, ok: { status: 201, description: '`{site}`' } },
  { method: 'get', path: '/api/sites/{id}', tag: 'Sites and envelopes', who: 'viewer', summary: 'Read a site', ok: { status: 200, description: '`{site}`' } },
  { method: 'patch', path: '/api/sites/{id}', tag: 'Sites and envelopes', who: 'editor', summary: 'Change a site', body: { schema: sitePatchSchema }, ok: { status: 200, description: '`{site}`' } },
  { method: 'delete', path: '/api/sites/{id}', tag: 'Sites and envelopes', who: 'editor', summary: 'Delete a site', ok: { status: 204, description: 'Deleted' } },
  { method: 'get', path: '/api/teams/{teamId}/envelopes', tag: 'Sites and envelopes', who: 'viewer', summary: "A team's envelopes", ok: { status: 200, description: '`{envelopes: [{id, teamId, name, minAltitude, …, usedBy}]}`' } },
  { method: 'post', path: '/api/teams/{teamId}/envelopes', tag: 'Sites and envelopes', who: 'editor', summary: 'Save an envelope', description: 'The envelope JSON: `name` required, every limit optional.', body: { schema: envelopeCreateSchema }, ok: { status: 201, description: '`{envelope}`' } },
  { method: 'get', path: '/api/envelopes/{id}', tag: 'Sites and envelopes', who: 'viewer', summary: 'Read an envelope', ok: { status: 200, description: '`{envelope}`' } },
  { method: 'patch', path: '/api/envelopes/{id}', tag: 'Sites and envelopes', who: 'editor', summary: 'Change an envelope', description: 'Merges the limits given; `null` clears one. Every scene using the envelope sees the change.', body: { schema: envelopePatchSchema }, ok: { status: 200, description: '`{envelope}`' } },
  { method: 'delete', path: '/api/envelopes/{id}', tag: 'Sites and envelopes', who: 'editor', summary: 'Delete an envelope', description: 'Scenes that used it keep its last limits inline.', ok: { status: 204, description: 'Deleted' } },
  { method: 'post', path: '/api/envelopes/{id}/horizon', tag: 'Sites and envelopes', who: 'editor', summary: "Replace an envelope's horizon mask from CSV", description: 'Multipart: `file` (azimuth,elevation rows) and `convention`. Bad rows: 422 with their line numbers, nothing changed.', body: { schema: horizonUpload, type: 'multipart/form-data' }, ok: { status: 200, description: '`{envelope, points, convention}`' }, errors: [413, 415, 422] },

  // ---------- teams ----------
  { method: 'get', path: '/api/teams', tag: 'Teams', who: 'signed-in', summary: 'Your teams', ok: { status: 200, description: '`{teams: [{id, name, role}]}`' } },
  { method: 'post', path: '/api/teams', tag: 'Teams', who: 'signed-in', summary: 'Make a team', description: 'You become its owner.', body: { schema: teamInput }, ok: { status: 201, description: '`{team}`' } },
  { method: 'get', path: '/api/teams/{teamId}/members', tag: 'Teams', who: 'viewer', summary: "A team's members", ok: { status: 200, description: '`{members: [{userId, email, name, role, joinedAt}]}`' } },
  { method: 'patch', path: '/api/teams/{teamId}/members/{userId}', tag: 'Teams', who: 'owner', summary: "Change a member's role", description: '409 `last_owner` when the team would have no owner.', body: { schema: roleInput }, ok: { status: 200, description: '`{member}`' }, errors: [409] },
  { method: 'delete', path: '/api/teams/{teamId}/members/{userId}', tag: 'Teams', who: 'signed-in', summary: 'Remove a member, or leave', description: 'Owners remove members; anyone may remove themselves. 409 `last_owner` for the only owner.', ok: { status: 204, description: 'Removed' }, errors: [409] },
  { method: 'get', path: '/api/teams/{teamId}/invitations', tag: 'Teams', who: 'owner', summary: 'Open invitations', ok: { status: 200, description: '`{invitations: [{id, email, role, createdAt, expiresAt}]}`' } },
  { method: 'post', path: '/api/teams/{teamId}/invitations', tag: 'Teams', who: 'owner', summary: 'Invite someone by e-mail', description: 'Mails a link to accept; it is valid for 7 days. At most 20 invitations per sender each clock hour and 50 per team each UTC day: past either, 429 with `Retry-After` and a message naming the limit.', body: { schema: invitationInput }, ok: { status: 201, description: 'The invitation' }, errors: [409, 429] },
  { method: 'delete', path: '/api/teams/{teamId}/invitations/{invitationId}', tag: 'Teams', who: 'owner', summary: 'Withdraw an invitation', ok: { status: 204, description: 'Withdrawn' } },
  { method: 'post', path: '/api/invitations/{token}/accept', tag: 'Teams', who: 'signed-in', summary: 'Accept an invitation', description: 'You join the team with the role the invitation gives.', ok: { status: 200, description: '`{team}`' }, errors: [409] },
  { method: 'get', path: '/api/teams/{teamId}/activity', tag: 'Teams', who: 'viewer', summary: "A team's activity", description: 'Newest first, from the audit log; page back with `before`.', query: activityQuerySchema, ok: { status: 200, description: '`{activity: [{id, at, action, subjectType, subjectId, user, detail}]}`' } },
  { method: 'get', path: '/api/teams/{teamId}/calendar-feed', tag: 'Teams', who: 'editor', summary: "Whether the team's calendar subscription exists", ok: { status: 200, description: '`{feed}` (the secret URL is shown only when it is made)' } },
  { method: 'post', path: '/api/teams/{teamId}/calendar-feed', tag: 'Teams', who: 'editor', summary: 'Make a new calendar subscription URL', description: 'Replaces the old one, which stops working.', ok: { status: 201, description: '`{id, token, url}`' } },
  { method: 'delete', path: '/api/teams/{teamId}/calendar-feed', tag: 'Teams', who: 'editor', summary: 'Revoke the calendar subscription', ok: { status: 204, description: 'Revoked' } },
  { method: 'get', path: '/api/calendars/{token}.ics', tag: 'Teams', who: 'anyone', summary: "A team's calendar subscription", description: 'The secret URL is the credential: one event per upcoming scene, with its site and a link.', ok: { status: 200, description: 'iCalendar', type: ICS } },

  // ---------- sky computation ----------
  { method: 'get', path: '/api/sky/observe', tag: 'Sky computation', who: 'anyone', summary: 'Where a body or star is seen from a site', description: 'Apparent topocentric place: azimuth, altitude (refracted unless `refraction=none`), hour angle, place of date, sidereal time, airmass, constellation. Give `body`, or `ra` and `dec` (ICRS, degrees) with optional space motion.', query: observeQuerySchema, ok: { status: 200, description: 'The apparent place', schema: observeAnswerSchema } },
  { method: 'get', path: '/api/sky/events', tag: 'Sky computation', who: 'anyone', summary: 'Rise, transit, set and twilights', description: 'Over `from` to `to` (at most 31 days), in time order.', query: eventsQuerySchema, ok: { status: 200, description: 'The events in time order', schema: eventsAnswerSchema } },
  { method: 'post', path: '/api/sky/windows', tag: 'Sky computation', who: 'anyone', summary: 'Visibility windows inside an envelope', description: 'For each target, the intervals when it is inside the envelope, crossings refined to 1 s; `reasons` name the limit that closes each window. A read token may call it.', body: { schema: windowsBodySchema }, ok: { status: 200, description: 'Each target’s windows', schema: windowsAnswerSchema }, errors: [413, 415] },

  // ---------- places ----------
  { method: 'get', path: '/api/places', tag: 'Places', who: 'anyone', summary: 'Search towns', description: 'Prefix matches first, accent- and case-insensitive, ranked by population. Places from GeoNames (CC BY 4.0).', query: placesQuerySchema, ok: { status: 200, description: 'Matching towns', schema: placesResponseSchema } },
  { method: 'get', path: '/api/places/zone', tag: 'Places', who: 'anyone', summary: 'The time zone at a point', query: zoneQuerySchema, ok: { status: 200, description: 'An IANA zone name', schema: zoneResponseSchema } },

  // ---------- service ----------
  { method: 'get', path: '/api/me', tag: 'Service', who: 'signed-in', summary: 'Who you are', ok: { status: 200, description: 'You and your teams', schema: meSchema } },
  { method: 'patch', path: '/api/me', tag: 'Service', who: 'signed-in', summary: 'Change your name', body: { schema: profileInput }, ok: { status: 200, description: 'As `GET /api/me`', schema: meSchema } },
  { method: 'get', path: '/api/health', tag: 'Service', who: 'anyone', summary: 'Service health', description: 'The database answers; compute pool, cache and database-writer figures.', ok: { status: 200, description: '`{ok: true, compute, caches, writes}`' } },
  { method: 'get', path: '/api/openapi.json', tag: 'Service', who: 'anyone', summary: 'This description (OpenAPI 3.1)', ok: { status: 200, description: 'The OpenAPI document' } },
];
