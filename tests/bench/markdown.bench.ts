// `npm run bench -- markdown`: the Markdown renderer (src/lib/markdown: markdown-it + js-xss). Prints tables and
// writes tests/bench/results/markdown.json. Figures, not a test (the outputs are asserted in
// tests/unit/markdown/markdown.test.ts).
//  1. A typical caption: mean time per render over 5,000 renders, warm.
//  2. Pathological inputs, after cmark's test/pathological_tests.py (https://github.com/commonmark/cmark), each at
//     three sizes up to the 20,000-character input cap: median of 5 warm renders. Time growing in proportion to
//     the size (ratio ≈ 2 per doubling) is linear; ≈ 4 would be quadratic.
//  3. What the renderer adds to the browser: src/lib/markdown bundled alone by esbuild (minified, as the
//     production build does), raw, gzip and brotli. In the app it is a chunk of its own, fetched after a viewer
//     link's first frame (components/briefing/Markdown.tsx).
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import { build } from 'esbuild';
import { renderMarkdown } from '../../src/lib/markdown';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const round = (x: number, d = 2) => Math.round(x * 10 ** d) / 10 ** d;

const CAPTION =
  '## Where to look\n\nLook **south-south-east**, low: *Sirius* clears the roof line at `alt > 5°` about 20 min after civil dusk.\nSee [the site page](https://larkspur.example/site?x=1&y=2).\n\n- first, find the belt stars\n- then follow them down and left\n\n3. check the envelope\n4. note the time';
for (let i = 0; i < 500; i++) renderMarkdown(CAPTION);
const N = 5000;
const t0 = performance.now();
for (let i = 0; i < N; i++) renderMarkdown(CAPTION);
const captionUs = ((performance.now() - t0) / N) * 1000;

/** Each case: a function of n (repetitions) and the n that fills the input cap. */
const CASES: Array<[string, (n: number) => string, number]> = [
  ['`[` repeated (link openers, no closers)', (n) => '['.repeat(n), 20000],
  ['nested brackets [[[a]]]', (n) => '['.repeat(n) + 'a' + ']'.repeat(n), 9999],
  ['nested emphasis *a **a … a** a*', (n) => '*a **a '.repeat(n) + 'b' + ' a** a*'.repeat(n), 1428],
  ['emphasis openers, no closers _a', (n) => '_a '.repeat(n), 6666],
  ['emphasis closers, no openers a_', (n) => 'a_ '.repeat(n), 6666],
  ['mismatched openers and closers *a_', (n) => '*a_ '.repeat(n), 5000],
  ['link openers and emphasis closers [ a_', (n) => '[ a_'.repeat(n), 5000],
  ['pattern [ (](', (n) => '[ (]('.repeat(n), 4000],
  ['unclosed links [a](b', (n) => '[a](b'.repeat(n), 4000],
  ['unclosed links [a](<b', (n) => '[a](<b'.repeat(n), 3333],
  ['link closers, no openers a]', (n) => 'a]'.repeat(n), 10000],
  ['one long backtick run', (n) => '`'.repeat(n) + 'a', 19999],
  ['backtick runs e`e``e```…', (n) => Array.from({ length: n }, (_, i) => 'e' + '`'.repeat(i + 1)).join(''), 197],
  ['`<` repeated', (n) => '<'.repeat(n), 20000],
  ['deeply nested lists', (n) => Array.from({ length: n }, (_, i) => ' '.repeat(i * 2) + '- a').join('\n'), 139],
];

const rows = CASES.map(([name, make, nMax]) => {
  const sizes = [Math.round(nMax / 4), Math.round(nMax / 2), nMax];
  const ms = sizes.map((n) => {
    const s = make(n);
    renderMarkdown(s);
    return median(Array.from({ length: 5 }, () => {
      const t = performance.now();
      renderMarkdown(s);
      return performance.now() - t;
    }));
  });
  return { input: name, chars: make(nMax).length, msQuarter: round(ms[0]!), msHalf: round(ms[1]!), msFull: round(ms[2]!), ratioLastDoubling: round(ms[2]! / Math.max(ms[1]!, 1e-3), 1) };
});

const bundle = await build({ entryPoints: ['src/lib/markdown/index.ts'], bundle: true, minify: true, format: 'esm', platform: 'browser', write: false, logLevel: 'error' });
const js = bundle.outputFiles[0]!.contents;
const size = { rawKB: round(js.length / 1000, 1), gzipKB: round(gzipSync(js, { level: 9 }).length / 1000, 1), brotliKB: round(brotliCompressSync(js, { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } }).length / 1000, 1) };

const result = { date: new Date().toISOString(), machine: { cpus: cpus().length, loadavg1: loadavg()[0], note: 'shared machine under load from other work' }, captionMicroseconds: round(captionUs, 1), pathological: rows, browserBundle: size };
console.log(`\nMarkdown (markdown-it + js-xss), machine: ${cpus().length} cores, load ${loadavg()[0]!.toFixed(1)} (shared)`);
console.log(`typical caption (${CAPTION.length} chars): ${round(captionUs, 1)} µs a render`);
console.log('| input | chars at the cap | ms at ¼ | ms at ½ | ms at the cap | last doubling ×  |');
console.log('| --- | --- | --- | --- | --- | --- |');
for (const r of rows) console.log(`| ${r.input} | ${r.chars} | ${r.msQuarter} | ${r.msHalf} | ${r.msFull} | ${r.ratioLastDoubling} |`);
console.log(`browser bundle of src/lib/markdown: ${size.rawKB} kB raw, ${size.gzipKB} kB gzip, ${size.brotliKB} kB brotli`);
mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/markdown.json', JSON.stringify(result, null, 2) + '\n');
console.log('written tests/bench/results/markdown.json');
