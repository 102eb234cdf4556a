/**
 * The OpenAPI 3.1 document of the API a personal token can reach, generated from operations.ts with
 * @asteasolutions/zod-to-openapi (why that package: README.md here). Built once per process, on first
 * use, and kept with its serialised text and an ETag.
 */
import { createHash } from 'node:crypto';
import { z, type ZodTypeAny } from 'zod';
import { extendZodWithOpenApi, OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { scopeNeeded, tokenReachable } from '../../contracts/token-access';
import type { TokenScope } from '../../contracts/tokens';
import { docSchema } from './doc-schema';
import { NAMED_SCHEMAS, OPERATIONS, TAGS, type Operation, type Who } from './operations';

// Adds `.openapi()` to zod's types, which the generator calls on query and path parameters. Only this
// server-side module does it; the schemas themselves carry no OpenAPI metadata.
extendZodWithOpenApi(z);

export const API_VERSION = '1';

/** The error body of every 4xx (DEVELOPERS.md "Errors"). */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string().describe('machine-readable, e.g. `invalid`, `not_found`, `version_conflict`'),
    message: z.string().describe('for people'),
    field: z.string().optional().describe('the parameter or body field at fault (dotted path), when there is one'),
  }),
});

/** Each refusal is described once under `components.responses` by this name. */
const ERROR_NAME: Record<number, string> = {
  400: 'BadRequest',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'NotFound',
  409: 'Conflict',
  413: 'TooLarge',
  415: 'UnsupportedMediaType',
  422: 'Unprocessable',
  429: 'TooManyRequests',
};

const ERROR_TEXT: Record<number, string> = {
  400: 'A parameter or a body field is invalid; `field` names it. Nothing was changed.',
  401: 'Not signed in, or the token is unknown or revoked.',
  403: 'Signed in, but your role (or a read token) does not allow this.',
  404: 'Not found, or it belongs to a team you are not in.',
  409: 'Conflict with the current state (e.g. a stale `version`).',
  413: 'The body is too large.',
  415: 'The body is not of the type this operation reads.',
  422: 'A file parsed but some rows or fields are invalid; nothing was changed.',
  429: 'Too many requests; retry after the `Retry-After` seconds.',
};

/** What every operation can answer besides its own statuses. */
export function errorStatuses(op: Operation): number[] {
  const out = new Set<number>(op.errors ?? []);
  if (op.query || op.body || /\{n\}/.test(op.path)) out.add(400);
  out.add(401); // a bad token, on every route
  if (scopeNeeded(op.method, op.path) === 'write' || (op.who !== 'anyone' && op.who !== 'signed-in')) out.add(403);
  if (op.path.includes('{')) out.add(404);
  out.add(429); // every token has a budget a minute
  out.delete(op.ok.status);
  return [...out].sort((a, b) => a - b);
}

const WHO_TEXT: Record<Who, string> = {
  anyone: 'No account needed.',
  'signed-in': 'Any signed-in account.',
  viewer: 'Viewer, reviewer, editor or owner of the team.',
  reviewer: 'Reviewer, editor or owner of the team.',
  editor: 'Editor or owner of the team.',
  owner: 'Owner of the team.',
  link: 'The share link in the path is the credential; no account needed.',
};
export const whoText = (who: Who) => WHO_TEXT[who];

const pathParams = (path: string) => [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);

/** `get /api/scenes/{id}/night` → `getScenesIdNight`. */
export function operationId(op: Pick<Operation, 'method' | 'path'>): string {
  const words = op.path.replace(/^\/api\//, '').split(/[^A-Za-z0-9]+/).filter(Boolean);
  return op.method + words.map((w) => w[0]!.toUpperCase() + w.slice(1)).join('');
}

function security(op: Operation, scope: TokenScope) {
  const signed = [{ bearerToken: [scope] }, { sessionCookie: [] }];
  return op.who === 'anyone' || op.who === 'link' ? [{}, ...signed] : signed;
}

function build() {
  const registry = new OpenAPIRegistry();
  const errorRef = registry.register('Error', apiErrorSchema);
  registry.registerComponent('securitySchemes', 'bearerToken', {
    type: 'http',
    scheme: 'bearer',
    description:
      'A personal API token (`arm_…`), made on the account page and shown once. A `read` token may use GET and `POST /api/sky/windows`; everything else needs a `write` token. A token never acts beyond its owner’s role in each team. Tokens and passwords are managed from a signed-in browser only (`/api/tokens`, `/api/auth/*` answer 403 to a token).',
  });
  registry.registerComponent('securitySchemes', 'sessionCookie', {
    type: 'apiKey',
    in: 'cookie',
    name: 'armilla_session',
    description: 'The browser’s session after signing in. Requests that change something must come from the same origin.',
  });

  // One memo for the whole document: a named schema is described once and referred to everywhere.
  const memo = new Map<ZodTypeAny, ZodTypeAny>();
  for (const [schema, name] of NAMED_SCHEMAS) memo.set(schema, registry.register(name, docSchema(schema, memo)));
  const doc = (schema: ZodTypeAny) => docSchema(schema, memo);

  for (const [status, name] of Object.entries(ERROR_NAME)) {
    registry.registerComponent('responses', name, { description: ERROR_TEXT[Number(status)]!, content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } });
  }

  const seen = new Set<string>();
  for (const op of OPERATIONS) {
    const key = `${op.method} ${op.path}`;
    if (seen.has(key)) throw new Error(`openapi: ${key} is listed twice`);
    if (!tokenReachable(op.path)) throw new Error(`openapi: ${key} is not reachable with a token (contracts/token-access.ts)`);
    seen.add(key);
    const scope = scopeNeeded(op.method, op.path);
    const params = pathParams(op.path);
    const responses: Record<string, { description: string; content?: Record<string, { schema: ZodTypeAny | object }> } | { $ref: string }> = {};
    const okType = op.ok.type ?? 'application/json';
    responses[String(op.ok.status)] =
      op.ok.status === 204
        ? { description: op.ok.description }
        : op.ok.status >= 400
          ? { description: op.ok.description, content: { 'application/json': { schema: errorRef } } }
          : { description: op.ok.description, content: { [okType]: { schema: op.ok.schema ? doc(op.ok.schema) : okType === 'application/json' ? { type: 'object' } : { type: 'string' } } } };
    for (const status of errorStatuses(op)) {
      responses[String(status)] = { $ref: `#/components/responses/${ERROR_NAME[status]}` };
    }
    registry.registerPath({
      method: op.method,
      path: op.path,
      operationId: operationId(op),
      summary: op.summary,
      description: [op.description, whoText(op.who)].filter(Boolean).join(' '),
      tags: [op.tag],
      security: security(op, scope),
      'x-token-scope': scope,
      'x-access': op.who,
      request: {
        ...(params.length ? { params: z.object(Object.fromEntries(params.map((p) => [p, z.string()]))) } : {}),
        ...(op.query ? { query: doc(op.query) as z.AnyZodObject } : {}),
        ...(op.body ? { body: { required: true, content: { [op.body.type ?? 'application/json']: { schema: doc(op.body.schema) } } } } : {}),
      },
      responses,
    } as Parameters<OpenAPIRegistry['registerPath']>[0]);
  }

  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Armilla API',
      version: API_VERSION,
      description:
        'Every route a personal API token can reach. Send `Authorization: Bearer <token>` to the same addresses the app uses. Angles in degrees, times ISO 8601 UTC, heights in metres, longitudes east-positive, azimuth from north through east. Every 4xx answers `{error: {code, message, field?}}`. Computed times are for planning: local rules and instrument interlocks take precedence.',
    },
    servers: [{ url: '/', description: 'This Armilla server' }],
    tags: TAGS.map((t) => ({ name: t.name, description: t.description })),
  });
}

export type OpenApiDocument = ReturnType<typeof build>;

let cached: { doc: OpenApiDocument; text: string; etag: string } | null = null;

/** The document, built on first use. */
export function openApi(): { doc: OpenApiDocument; text: string; etag: string } {
  if (!cached) {
    const doc = build();
    const text = JSON.stringify(doc);
    cached = { doc, text, etag: `"${createHash('sha256').update(text).digest('base64url').slice(0, 22)}"` };
  }
  return cached;
}
