// `npm run bench`: runs every benchmark script in tests/bench/ (one process each, one after another so
// they do not compete for the 2 cores), then gathers their JSON into tests/bench/results/summary.json
// with the machine they ran on. Benchmarks print their own tables. `npm run bench -- sky` runs a subset.
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, writeFileSync, mkdirSync, existsSync } from 'node:fs';
import { cpus, totalmem, platform, release } from 'node:os';
import { join } from 'node:path';

const dir = 'tests/bench';
const filter = process.argv.slice(2);
const scripts = readdirSync(dir)
  .filter((f) => /\.(mjs|ts)$/.test(f) && f !== 'run.mjs' && f !== 'load.ts' && f !== 'windows-body.ts' && !f.startsWith('_'))
  .filter((f) => !filter.length || filter.some((p) => f.includes(p)))
  .sort();

if (!existsSync('dist/server/armilla.mjs') || process.env.BENCH_BUILD === '1') {
  const b = spawnSync('npx', ['astro', 'build'], { stdio: 'inherit' });
  if (b.status !== 0) process.exit(1);
}

mkdirSync(join(dir, 'results'), { recursive: true });
const ran = [];
for (const f of scripts) {
  console.log(`\n=== ${f} ===`);
  const t0 = Date.now();
  const r = spawnSync('npx', ['tsx', join(dir, f)], { stdio: 'inherit', env: process.env });
  ran.push({ script: f, exitCode: r.status, seconds: (Date.now() - t0) / 1000 });
}

const results = {};
for (const f of readdirSync(join(dir, 'results'))) {
  if (!f.endsWith('.json') || f === 'summary.json') continue;
  try {
    results[f.replace(/\.json$/, '')] = JSON.parse(readFileSync(join(dir, 'results', f), 'utf8'));
  } catch {
    /* a half-written file from an interrupted run */
  }
}
const summary = {
  at: new Date().toISOString(),
  machine: { cpu: cpus()[0]?.model, cores: cpus().length, memoryGiB: Math.round(totalmem() / 2 ** 30), os: `${platform()} ${release()}`, node: process.version },
  ran,
  results,
};
writeFileSync(join(dir, 'results', 'summary.json'), JSON.stringify(summary, null, 2));
console.log(`\nbench: ${ran.length} script(s); summary in tests/bench/results/summary.json`);
process.exit(ran.some((r) => r.exitCode !== 0) ? 1 : 0);
