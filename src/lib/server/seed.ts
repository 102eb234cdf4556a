import type { Db } from './db/client';

/** Seeds the demo on an empty database (no users); never touches one that has users. Implemented in the foundation work. */
export async function seedDemo(_db: Db): Promise<boolean> {
  return false;
}
