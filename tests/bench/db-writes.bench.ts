// `npm run bench -- db-writes`: the database module's write path in this process, without HTTP.
// 20 writers, each saving its own scene (`updateScene`: head read, UPDATE … RETURNING, version snapshot,
// audit line) SAVES times in a loop, on a fresh demo database in a temp file, under each option of the
// module: group commit on/off × durability by an fsync off the event loop / SQLite's synchronous = FULL.
// Reports saves/s, server CPU ms a save (process.cpuUsage: user + system, all threads), latency p50/p99
// and writes per COMMIT. Prints a table and writes tests/bench/results/db-writes.json. Figures, not a test.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { openDb, type OpenOptions } from '../../src/lib/server/db/client';
import { migrateDb } from '../../src/lib/server/db/migrate';
import { scenes, users } from '../../src/lib/server/db/schema';
import { seedDemo } from '../../src/lib/server/seed';
import { updateScene } from '../../src/lib/server/scene-service';

const WRITERS = 20;
const SAVES = Number(process.env.BENCH_SAVES ?? 60);
const round = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;

async function run(label: string, opts: OpenOptions) {
  const dir = mkdtempSync(join(tmpdir(), 'armilla-dbw-'));
  const db = await openDb(`file:${join(dir, 'w.db')}`, opts);
  try {
    await migrateDb(db);
    await seedDemo(db);
    const userId = (await db.select({ id: users.id }).from(users).limit(1))[0]!.id;
    const row = (await db.select().from(scenes).limit(1))[0]!;
    const own = Array.from({ length: WRITERS }, (_, i) => ({ id: `bench-${i}`, version: 1 }));
    await db.write(async (tx) => {
      for (const s of own) await tx.insert(scenes).values({ ...row, id: s.id, version: 1 });
    });
    const before = { ...db.writeStats };
    const latencies: number[] = [];
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    await Promise.all(
      own.map(async (s, i) => {
        for (let n = 0; n < SAVES; n++) {
          const started = performance.now();
          s.version = (await updateScene(db, userId, s.id, { version: s.version, title: `Writer ${i}, save ${n}` })).version;
          latencies.push(performance.now() - started);
        }
      }),
    );
    const wallMs = performance.now() - t0;
    const cpu = process.cpuUsage(cpu0);
    const check = await db.select({ version: scenes.version }).from(scenes).where(eq(scenes.id, 'bench-0'));
    if (check[0]?.version !== SAVES + 1) throw new Error(`${label}: bench-0 at version ${check[0]?.version}, expected ${SAVES + 1}`);
    latencies.sort((a, b) => a - b);
    const commits = db.writeStats.batches - before.batches;
    return {
      options: label,
      saves: latencies.length,
      savesPerSecond: Math.round((latencies.length / wallMs) * 1000),
      cpuMsPerSave: round((cpu.user + cpu.system) / 1000 / latencies.length, 2),
      p50Ms: round(latencies[Math.floor(latencies.length * 0.5)]!),
      p99Ms: round(latencies[Math.floor(latencies.length * 0.99)]!),
      commits,
      writesPerCommit: round((db.writeStats.jobs - before.jobs) / Math.max(1, commits)),
    };
  } finally {
    db.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

const configs: Array<[string, OpenOptions]> = [
  ['group commit, fsync off the event loop (default)', { groupCommit: true, sync: 'fsync-off-loop' }],
  ['group commit, synchronous = FULL', { groupCommit: true, sync: 'full' }],
  ['no group commit, fsync off the event loop', { groupCommit: false, sync: 'fsync-off-loop' }],
  ['no group commit, synchronous = FULL', { groupCommit: false, sync: 'full' }],
];
const results = [];
for (const [label, opts] of configs) results.push(await run(label, opts));

console.log(`\n${WRITERS} writers × ${SAVES} saves each (updateScene), in-process\n`);
console.log('| options | saves/s | CPU ms/save | p50 ms | p99 ms | writes/commit |');
console.log('| --- | ---: | ---: | ---: | ---: | ---: |');
for (const r of results) console.log(`| ${r.options} | ${r.savesPerSecond} | ${r.cpuMsPerSave} | ${r.p50Ms} | ${r.p99Ms} | ${r.writesPerCommit} |`);
mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/db-writes.json', JSON.stringify({ at: new Date().toISOString(), writers: WRITERS, savesEach: SAVES, results }, null, 2));
console.log('\nwritten tests/bench/results/db-writes.json');
