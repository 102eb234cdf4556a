import { migrate } from 'drizzle-orm/libsql/migrator';
import { fileURLToPath } from 'node:url';
import { resolve } from 'node:path';
import type { Db } from './client';

/** Folder of the committed SQL migrations, resolved from the repository root. */
export const MIGRATIONS_FOLDER = resolve(fileURLToPath(new URL('../../../../drizzle', import.meta.url)));

/** Applies the migrations alone on the writer's connection (nothing else writes meanwhile). */
export async function migrateDb(db: Db, folder = MIGRATIONS_FOLDER): Promise<void> {
  await db.exclusive((raw) => migrate(raw, { migrationsFolder: folder }));
}
