/**
 * Personal API tokens: `Authorization: Bearer arm_…` acts as the token's owner on the routes a browser
 * uses. The secret (256 random bits) is shown once; only its SHA-256 is stored and a request's token is
 * found by the hash through a unique index. A token never grants more than its scope (read: GET and
 * HEAD only) and its owner's role in each team (policy.ts decides that as for a session). Unknown and
 * revoked tokens get the same 401; failed attempts are counted per client address.
 */
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, isNull, lt, or, sql } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import type { User } from 'lucia';
import { db as appDb } from '../db';
import { writeTx, type DbOrTx } from '../db/client';
import { apiTokens, users } from '../db/schema';
import { audit } from '../audit';
import { HttpError, notFound } from '../http';
import { rateLimit } from '../rate-limit';
import { MAX_TOKENS_PER_USER, type TokenCreate, type TokenOut, type TokenScope } from '../../contracts/tokens';

const PREFIX = 'arm_';
/** `arm_` + 43 base64url characters (32 random bytes). */
const TOKEN_RE = /^arm_[A-Za-z0-9_-]{43}$/;
const HINT_LENGTH = 6;
const LAST_USED_GRANULARITY_MS = 60_000;
/** Requests a token may make a minute (the budget of the anonymous compute API for one address). */
export const TOKEN_REQUESTS_PER_MINUTE = 600;
/** Failed bearer attempts per client address in 15 minutes before 429 (as sign-in failures). */
export const BEARER_FAILURES_PER_WINDOW = 30;

const hash = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

type TokenRow = typeof apiTokens.$inferSelect;

export const tokenOut = (r: TokenRow): TokenOut => ({
  id: r.id,
  name: r.name,
  scope: r.scope,
  hint: `${PREFIX}${r.hint}…`,
  createdAt: r.createdAt.toISOString(),
  lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
});

export async function listTokens(db: DbOrTx, userId: string): Promise<TokenOut[]> {
  const rows = await db.select().from(apiTokens).where(eq(apiTokens.userId, userId)).orderBy(desc(apiTokens.createdAt));
  return rows.map(tokenOut);
}

export async function createToken(db: DbOrTx, userId: string, input: TokenCreate): Promise<TokenOut & { token: string }> {
  const secret = randomBytes(32).toString('base64url');
  const token = `${PREFIX}${secret}`;
  const id = nanoid();
  const now = new Date();
  const row: TokenRow = { id, userId, name: input.name, scope: input.scope, tokenHash: hash(token), hint: secret.slice(0, HINT_LENGTH), createdAt: now, lastUsedAt: null };
  await writeTx(db, async (tx) => {
    const [{ n }] = await tx.select({ n: sql<number>`count(*)` }).from(apiTokens).where(eq(apiTokens.userId, userId));
    if (Number(n) >= MAX_TOKENS_PER_USER) {
      throw new HttpError(409, 'too_many_tokens', `You have ${MAX_TOKENS_PER_USER} tokens already; revoke one first.`);
    }
    await tx.insert(apiTokens).values(row);
    await audit(tx, { userId, action: 'token.create', subjectType: 'token', subjectId: id, detail: { name: input.name, scope: input.scope } });
  });
  return { ...tokenOut(row), token };
}

/** Revoking deletes the row: the hash is gone, so the token can never match again. Another member's id: 404. */
export async function revokeToken(db: DbOrTx, userId: string, id: string): Promise<void> {
  await writeTx(db, async (tx) => {
    const gone = await tx.delete(apiTokens).where(and(eq(apiTokens.id, id), eq(apiTokens.userId, userId))).returning({ name: apiTokens.name });
    if (!gone.length) throw notFound('Token');
    await audit(tx, { userId, action: 'token.revoke', subjectType: 'token', subjectId: id, detail: { name: gone[0]!.name } });
  });
}

/** The bearer credential of a request, or null when it carries none. A malformed header counts as a bad token. */
export function bearerOf(request: Request): string | null {
  const h = request.headers.get('authorization');
  if (h === null) return null;
  const m = /^Bearer[ ]+(\S+)\s*$/i.exec(h);
  return m ? m[1]! : '';
}

export interface TokenAuth {
  user: User;
  token: { id: string; scope: TokenScope };
}

const invalidToken = () =>
  new HttpError(401, 'unauthorized', 'The API token is not valid.', undefined, undefined, { 'www-authenticate': 'Bearer error="invalid_token"' });

const touching = new Map<string, Promise<unknown>>();

/** Records a use at most once a minute per token (the condition is in the UPDATE too, for several instances). */
async function touch(id: string, lastUsedAt: Date | null, now: number): Promise<void> {
  if (lastUsedAt && now - lastUsedAt.getTime() <= LAST_USED_GRANULARITY_MS) return;
  let p = touching.get(id);
  if (!p) {
    const stale = or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, new Date(now - LAST_USED_GRANULARITY_MS)));
    p = writeTx(appDb, (tx) => tx.update(apiTokens).set({ lastUsedAt: new Date(now) }).where(and(eq(apiTokens.id, id), stale))).finally(() => touching.delete(id));
    touching.set(id, p);
  }
  await p;
}

/**
 * Resolves a bearer token to its owner. Throws 401 (same answer for malformed, unknown and revoked), or 429
 * when this address has failed too often or the token has spent its minute's budget.
 */
export async function authenticateBearer(token: string, address: string, now = Date.now()): Promise<TokenAuth> {
  const row = TOKEN_RE.test(token)
    ? (
        await appDb
          .select({ id: apiTokens.id, scope: apiTokens.scope, lastUsedAt: apiTokens.lastUsedAt, userId: users.id, email: users.email, name: users.name })
          .from(apiTokens)
          .innerJoin(users, eq(users.id, apiTokens.userId))
          .where(eq(apiTokens.tokenHash, hash(token)))
          .limit(1)
      )[0]
    : undefined;
  if (!row) {
    await rateLimit(`bearer-fail:${address}`, BEARER_FAILURES_PER_WINDOW, 900, now);
    throw invalidToken();
  }
  await rateLimit(`token:${row.id}`, TOKEN_REQUESTS_PER_MINUTE, 60, now);
  await touch(row.id, row.lastUsedAt, now);
  return { user: { id: row.userId, email: row.email, name: row.name }, token: { id: row.id, scope: row.scope } };
}

/** Where a token may go and what its scope allows: one pure definition (contracts/token-access.ts). */
export { scopeAllows, sessionOnly, tokenReachable } from '../../contracts/token-access';
