import { defineConfig } from 'drizzle-kit';
import { z } from 'zod';

const env = z
  .object({ DATABASE_URL: z.string().default('file:./data/armilla.db'), DATABASE_AUTH_TOKEN: z.string().optional() })
  .parse(process.env);

export default defineConfig({
  dialect: 'turso',
  schema: './src/lib/server/db/schema/index.ts',
  out: './drizzle',
  dbCredentials: { url: env.DATABASE_URL, authToken: env.DATABASE_AUTH_TOKEN },
  casing: 'snake_case',
  strict: true,
});
