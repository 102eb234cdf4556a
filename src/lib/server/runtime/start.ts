/**
 * `npm start`: build when the sources are newer than dist/, apply migrations, seed the demo on an
 * empty database, run the mail fake (maildev) when SMTP_URL is unset, then serve the app.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { openDb, DEFAULT_DATABASE_URL } from '../db/client';
import { migrateDb } from '../db/migrate';
import { seedDemo } from '../seed';

const env = z
  .object({
    PORT: z.coerce.number().int().min(1).max(65535).default(4321),
    HOST: z.string().default('127.0.0.1'),
    DATABASE_URL: z.string().default(DEFAULT_DATABASE_URL),
    DATABASE_AUTH_TOKEN: z.string().optional(),
    SMTP_URL: z.string().url().optional(),
    MAILDEV_SMTP_PORT: z.coerce.number().int().default(1025),
    MAILDEV_WEB_PORT: z.coerce.number().int().default(1080),
    SKIP_BUILD: z.string().optional(),
  })
  .parse(process.env);

function newest(dir: string): number {
  let t = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    t = Math.max(t, e.isDirectory() ? newest(p) : statSync(p).mtimeMs);
  }
  return t;
}

// the server the build writes (./integration.mjs); paths are relative to the repository root, where npm runs
const entry = 'dist/server/armilla.mjs';
const stale =
  !existsSync(entry) ||
  Math.max(newest('src'), newest('public'), statSync('astro.config.mjs').mtimeMs) > statSync(entry).mtimeMs;
if (stale && env.SKIP_BUILD !== '1') {
  console.log('[armilla] building the app…');
  const r = spawnSync('npx', ['astro', 'build'], { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

const db = await openDb(env.DATABASE_URL, { authToken: env.DATABASE_AUTH_TOKEN });
await migrateDb(db);
console.log('[armilla] migrations applied');
if (await seedDemo(db)) console.log('[armilla] demo data seeded (password for every demo account: armilla-demo)');
db.close();

const children: ChildProcess[] = [];
let smtpUrl = env.SMTP_URL;
if (!smtpUrl) {
  const maildev = spawn(
    process.execPath,
    [
      'node_modules/maildev/bin/maildev',
      '--smtp', String(env.MAILDEV_SMTP_PORT),
      '--web', String(env.MAILDEV_WEB_PORT),
      '--ip', '127.0.0.1',
      '--web-ip', '127.0.0.1',
      '--silent',
    ],
    { stdio: 'inherit' },
  );
  children.push(maildev);
  smtpUrl = `smtp://127.0.0.1:${env.MAILDEV_SMTP_PORT}`;
  console.log(`[armilla] mail fake (maildev): inbox at http://127.0.0.1:${env.MAILDEV_WEB_PORT}`);
}

const origin = process.env.PUBLIC_ORIGIN ?? `http://${env.HOST === '0.0.0.0' ? 'localhost' : env.HOST}:${env.PORT}`;
const app = spawn(process.execPath, [entry], {
  stdio: 'inherit',
  env: { ...process.env, HOST: env.HOST, PORT: String(env.PORT), DATABASE_URL: env.DATABASE_URL, SMTP_URL: smtpUrl, PUBLIC_ORIGIN: origin },
});
children.push(app);
console.log(`[armilla] serving on ${origin}`);

const stop = () => {
  for (const c of children) c.kill('SIGTERM');
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
app.on('exit', (code) => {
  stop();
  process.exit(code ?? 0);
});
