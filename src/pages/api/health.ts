import { sql } from 'drizzle-orm';
import { db } from '../../lib/server/db';
import { json, route } from '../../lib/server/http';
import { computePool } from '../../lib/server/compute';
import { cacheStats } from '../../lib/server/caches';

/**
 * Liveness for operators and probes: the database answers; the compute pool's figures, the caches' sizes
 * and hit rates, and the database writer's batches (group commit: jobs per COMMIT). Never computes.
 */
export const GET = route(async () => {
  await db.get(sql`select 1`);
  return json({ ok: true, compute: computePool().stats(), caches: cacheStats(), writes: { ...db.writeStats } });
});
