import { DATABASE_URL, DATABASE_AUTH_TOKEN } from 'astro:env/server';
import { openDb, DEFAULT_DATABASE_URL, type Database } from './client';

export * from './client';
export * as schema from './schema';

/** The app's one database handle (see client.ts: reads, `write`, `transaction`). */
export const db: Database = await openDb(DATABASE_URL ?? DEFAULT_DATABASE_URL, { authToken: DATABASE_AUTH_TOKEN });
