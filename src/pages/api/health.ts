import { sql } from 'drizzle-orm';
import { db } from '../../lib/server/db';
import { json, route } from '../../lib/server/http';

export const GET = route(async () => {
  await db.run(sql`select 1`);
  return json({ ok: true });
});
