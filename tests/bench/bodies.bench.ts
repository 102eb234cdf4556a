// `npm run bench -- bodies`: the cost of the Sun, Moon and planets per drawn frame and per night.
// Prints a table and writes tests/bench/results/bodies.json. Medians; nothing here is a test.
//
// (a) all nine bodies' apparent topocentric vectors (bodyVector, what the view calls each frame while
//     time plays), time advancing 1 min a frame so no cache is hit; frame included.
// (b) the same with the clock stopped (the per-body cache answers).
// (c) astronomy-engine's own topocentric Equator() for the nine, the chain used before the VSOP87B series.
// (d) a night of samples: nine bodies every 5 min over 24 h (288 instants), as night charts ask.
import { mkdirSync, writeFileSync } from 'node:fs';
import { Astronomy } from '../../src/lib/sky/astronomy';
import { skyFrame } from '../../src/lib/sky/apparent';
import { BODY_NAMES, bodyVector, astronomyBody } from '../../src/lib/sky/bodies';
import { SERIES_TERMS } from '../../src/lib/sky/planets/series';

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const site = { latDeg: 51.4769, lonDeg: 0, heightM: 0 };
const t0 = Date.parse('2024-01-15T22:00:00Z');
let k = 0;
const frames = (moving: boolean) => {
  const f = skyFrame(site, new Date(t0 + (moving ? ++k : 0) * 60000));
  for (const b of BODY_NAMES) bodyVector(f, b);
};
const time = (fn: () => void, runs: number) => {
  for (let i = 0; i < 50; i++) fn();
  const xs: number[] = [];
  for (let i = 0; i < runs; i++) {
    const a = performance.now();
    fn();
    xs.push(performance.now() - a);
  }
  return median(xs);
};
const moving = time(() => frames(true), 400);
const still = time(() => frames(false), 400);
const obs = new Astronomy.Observer(site.latDeg, site.lonDeg, site.heightM);
const ae = time(() => {
  const t = Astronomy.MakeTime(new Date(t0 + ++k * 60000));
  for (const b of BODY_NAMES) Astronomy.Equator(astronomyBody(b), t, obs, false, true);
}, 400);
const night = time(() => {
  for (let i = 0; i < 288; i++) {
    const f = skyFrame(site, new Date(t0 + ++k * 300000));
    for (const b of BODY_NAMES) bodyVector(f, b);
  }
}, 15);

const terms = Object.values(SERIES_TERMS).reduce((a, b) => a + b, 0);
const rows: [string, string][] = [
  ['(a) 9 bodies, one frame, clock running (median of 400)', `${moving.toFixed(3)} ms`],
  ['(b) 9 bodies, one frame, clock stopped', `${still.toFixed(3)} ms`],
  ['(c) astronomy-engine Equator() for the 9 (the former chain)', `${ae.toFixed(3)} ms`],
  ['(d) 9 bodies × 288 instants (a night at 5 min)', `${night.toFixed(1)} ms`],
  ['VSOP87B terms kept (8 series)', `${terms}`],
];
const w0 = Math.max(...rows.map((r) => r[0].length));
console.log('\nBodies benchmarks');
for (const [a, b] of rows) console.log(`${a.padEnd(w0)}  ${b}`);
mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/bodies.json', JSON.stringify({ at: new Date().toISOString(), node: process.version, frameMovingMs: moving, frameStillMs: still, astronomyEngineMs: ae, nightMs: night, terms, termsByBody: SERIES_TERMS }, null, 2) + '\n');
