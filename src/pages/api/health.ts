import { sql } from 'drizzle-orm';
import { db } from '../../lib/server/db';
import { json, route } from '../../lib/server/http';
import { computePool } from '../../lib/server/compute';

/** Liveness for operators and probes: the database answers; the compute pool's figures. Never computes. */
export const GET = route(async () => {
  await db.run(sql`select 1`);
  return json({ ok: true, compute: computePool().stats() });
});
