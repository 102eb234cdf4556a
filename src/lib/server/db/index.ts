import { DATABASE_URL, DATABASE_AUTH_TOKEN } from 'astro:env/server';
import { openDb, DEFAULT_DATABASE_URL, type Db } from './client';

export * from './client';
export * as schema from './schema';

const handle = await openDb(DATABASE_URL ?? DEFAULT_DATABASE_URL, DATABASE_AUTH_TOKEN);
/** The app's one database handle. */
export const db: Db = handle.db;
export const dbClient = handle.client;
