/** A team's pointing envelopes (server-only; services take `Db | Tx`). */
import { asc, count, eq } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import type { User } from 'lucia';
import { writeTx, type DbOrTx } from './db/client';
import { envelopes, scenes } from './db/schema';
import { audit } from './audit';
import { fromZod, notFound } from './http';
import { authorize, type Action } from './policy';
import { mergeEnvelope, teamEnvelopeSchema, type TeamEnvelopeJson } from '../contracts/envelope';
import { envelopeOf } from './scene-service';

type EnvelopeRow = typeof envelopes.$inferSelect;

/** The envelope JSON of the contract, flat, plus the server's id and times. */
export const envelopeOut = (r: EnvelopeRow, usedBy?: number) => ({
  ...envelopeOf(r.data),
  id: r.id,
  teamId: r.teamId,
  createdAt: r.createdAt.toISOString(),
  updatedAt: r.updatedAt.toISOString(),
  ...(usedBy !== undefined ? { usedBy } : {}),
});

export async function listEnvelopes(db: DbOrTx, teamId: string) {
  const rows = await db.select().from(envelopes).where(eq(envelopes.teamId, teamId)).orderBy(asc(envelopes.name));
  const uses = await db
    .select({ envelopeId: scenes.envelopeId, n: count() })
    .from(scenes)
    .where(eq(scenes.teamId, teamId))
    .groupBy(scenes.envelopeId);
  const used = new Map(uses.map((u) => [u.envelopeId, u.n]));
  return rows.map((r) => envelopeOut(r, used.get(r.id) ?? 0));
}

export async function envelopeFor(db: DbOrTx, user: User, id: string, action: Action) {
  const rows = await db.select().from(envelopes).where(eq(envelopes.id, id)).limit(1);
  if (!rows[0]) throw notFound('Envelope');
  await authorize(db, user, rows[0].teamId, action, 'Envelope');
  return rows[0];
}

export async function createEnvelope(db: DbOrTx, teamId: string, data: TeamEnvelopeJson, userId: string | null, id = nanoid()) {
  const e = teamEnvelopeSchema.parse(data);
  const at = new Date();
  await writeTx(db, async (tx) => {
    await tx.insert(envelopes).values({ id, teamId, name: e.name, data: e, createdBy: userId, createdAt: at, updatedAt: at });
    await audit(tx, { teamId, userId, action: 'envelope.create', subjectType: 'envelope', subjectId: id, detail: { name: e.name } });
  });
  const rows = await db.select().from(envelopes).where(eq(envelopes.id, id));
  return envelopeOut(rows[0]);
}

/** Merges the patch into the stored envelope and validates the whole; every scene using it sees the change. */
export async function updateEnvelope(db: DbOrTx, row: EnvelopeRow, patch: Record<string, unknown>, userId: string, action = 'envelope.update') {
  const r = teamEnvelopeSchema.safeParse(mergeEnvelope(envelopeOf(row.data), patch));
  if (!r.success) throw fromZod(r.error);
  const e = r.data;
  await writeTx(db, async (tx) => {
    await tx.update(envelopes).set({ name: e.name, data: e, updatedAt: new Date() }).where(eq(envelopes.id, row.id));
    await audit(tx, { teamId: row.teamId, userId, action, subjectType: 'envelope', subjectId: row.id, detail: { fields: Object.keys(patch) } });
  });
  const rows = await db.select().from(envelopes).where(eq(envelopes.id, row.id));
  return envelopeOut(rows[0]);
}

/** Scenes that used the envelope keep its last limits inline, so deleting it never silently widens a plan. */
export async function deleteEnvelope(db: DbOrTx, row: EnvelopeRow, userId: string) {
  await writeTx(db, async (tx) => {
    await tx.update(scenes).set({ envelope: envelopeOf(row.data), envelopeId: null }).where(eq(scenes.envelopeId, row.id));
    await tx.delete(envelopes).where(eq(envelopes.id, row.id));
    await audit(tx, { teamId: row.teamId, userId, action: 'envelope.delete', subjectType: 'envelope', subjectId: row.id, detail: { name: row.name } });
  });
}
