// `npm test`: type check, migration check, build once, then unit, integration and browser tests.
// Prints a closing "N passed, N failed" line that any CI reader understands.
import { spawnSync } from 'node:child_process';
import { readFileSync, mkdirSync } from 'node:fs';
import { loadavg } from 'node:os';

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
// Without arguments: unit, integration and e2e together, then the adversarial suite (project "hostile")
// alone, since it times the server's answers and must not share the two cores with other test servers.
const runs = only.length ? [only] : [['unit', 'integration', 'e2e'], ['hostile']];
let status = 0;
let passed = 0;
let testsFailed = 0;
let skipped = 0;
runs.forEach((group, i) => {
  if (group.includes('hostile') && runs.length > 1) {
    // The suite times /api/health: let the servers and browsers of the run before it finish exiting.
    spawnSync('sleep', ['15']);
    console.log(`\nload average before the adversarial suite: ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  }
  const out = `tests/e2e/output/vitest-${i}.json`;
  const s = run(
    'npx',
    ['vitest', 'run', ...group.flatMap((p) => ['--project', p]), '--reporter=default', '--reporter=json', `--outputFile.json=${out}`],
    { ARMILLA_SKIP_BUILD: '1' },
  );
  if (s !== 0) status = s;
  try {
    const r = JSON.parse(readFileSync(out, 'utf8'));
    passed += r.numPassedTests;
    testsFailed += r.numFailedTests + (r.numRuntimeErrorTestSuites ?? 0);
    skipped += r.numPendingTests + r.numTodoTests;
  } catch {
    testsFailed += 1;
  }
});
if (status !== 0 && testsFailed === 0) testsFailed = 1;
if (failed) console.log(`\n${failed} check step(s) failed (astro check / drizzle-kit check)`);
console.log(`\ntests: ${passed} passed, ${testsFailed + failed} failed, ${skipped} skipped`);
process.exit(status !== 0 || failed ? 1 : 0);
