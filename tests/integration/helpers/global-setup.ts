import { execSync } from 'node:child_process';
import { existsSync } from 'node:fs';

/** Builds the app once per run unless ARMILLA_SKIP_BUILD=1 (tests/run.mjs builds before vitest). */
export default function setup() {
  if (process.env.ARMILLA_SKIP_BUILD === '1' && existsSync('dist/server/armilla.mjs')) return;
  execSync('npx astro build', { stdio: 'inherit' });
  process.env.ARMILLA_SKIP_BUILD = '1';
}
