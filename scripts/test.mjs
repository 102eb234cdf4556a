// `npm test`: type check, migration check, build once, then unit, integration and browser tests.
// Prints a closing "N passed, N failed" line that any CI reader understands.
import { spawnSync } from 'node:child_process';
import { readFileSync, mkdirSync } from 'node:fs';

function run(cmd, args, env = {}) {
  console.log(`\n$ ${cmd} ${args.join(' ')}`);
  const r = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } });
  return r.status ?? 1;
}

const only = process.argv.slice(2); // e.g. `npm test -- unit`
let failed = 0;
if (!only.length) {
  if (run('npx', ['astro', 'check', '--minimumFailingSeverity', 'error']) !== 0) failed++;
  if (run('npx', ['drizzle-kit', 'check']) !== 0) failed++;
}
if (run('npx', ['astro', 'build']) !== 0) process.exit(1);

mkdirSync('tests/e2e/output', { recursive: true });
const projects = only.length ? only.flatMap((p) => ['--project', p]) : [];
const status = run(
  'npx',
  ['vitest', 'run', ...projects, '--reporter=default', '--reporter=json', '--outputFile.json=tests/e2e/output/vitest.json'],
  { ARMILLA_SKIP_BUILD: '1' },
);
let passed = 0;
let testsFailed = 0;
let skipped = 0;
try {
  const r = JSON.parse(readFileSync('tests/e2e/output/vitest.json', 'utf8'));
  passed = r.numPassedTests;
  testsFailed = r.numFailedTests + (r.numRuntimeErrorTestSuites ?? 0);
  skipped = r.numPendingTests + r.numTodoTests;
} catch {
  testsFailed = 1;
}
if (status !== 0 && testsFailed === 0) testsFailed = 1;
if (failed) console.log(`\n${failed} check step(s) failed (astro check / drizzle-kit check)`);
console.log(`\ntests: ${passed} passed, ${testsFailed + failed} failed, ${skipped} skipped`);
process.exit(status !== 0 || failed ? 1 : 0);
