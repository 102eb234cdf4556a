/**
 * The import graph of src/ and the one-way rules it must keep (see DEVELOPERS.md "Rules").
 * Imports are read with TypeScript's own pre-processor (the same scanner tsc uses, so comments and
 * strings are not mistaken for imports); `.astro` files contribute their front matter and scripts.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import ts from 'typescript';

export interface Edge {
  from: string; // repo-relative, forward slashes
  to: string; // repo-relative file, or the bare specifier of a package ('zod', 'node:fs', 'astro:env/server')
}

const EXTS = ['.ts', '.tsx', '.mts', '.mjs', '.js', '.astro', '.json'];
const posix = (p: string) => p.split(sep).join('/');

function listFiles(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) listFiles(p, out);
    else if (/\.(tsx?|mts|mjs|js|astro)$/.test(name)) out.push(p);
  }
  return out;
}

function resolveRelative(fromFile: string, spec: string): string | null {
  const base = resolve(dirname(fromFile), spec);
  if (existsSync(base) && statSync(base).isFile()) return base;
  for (const e of EXTS) if (existsSync(base + e)) return base + e;
  for (const e of EXTS) if (existsSync(join(base, 'index' + e))) return join(base, 'index' + e);
  return null;
}

/** The code of a file as TypeScript sees it; for .astro, the front matter and <script> bodies. */
function codeOf(file: string): string {
  const text = readFileSync(file, 'utf8');
  if (!file.endsWith('.astro')) return text;
  const parts: string[] = [];
  const fm = /^---\r?\n([\s\S]*?)\r?\n---/.exec(text);
  if (fm) parts.push(fm[1]);
  for (const m of text.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/g)) parts.push(m[1]);
  return parts.join('\n');
}

/** Every import edge from files under `srcDir` (repo-relative to `root`). Unresolvable relative imports throw. */
export function importGraph(root: string, srcDir = 'src'): Edge[] {
  const edges: Edge[] = [];
  for (const file of listFiles(join(root, srcDir))) {
    const info = ts.preProcessFile(codeOf(file), true, true);
    for (const ref of info.importedFiles) {
      const spec = ref.fileName;
      let to: string;
      if (spec.startsWith('.')) {
        // A Vite query (`./example.py?raw`) names the same file.
        const hit = resolveRelative(file, spec.replace(/\?.*$/, ''));
        if (!hit) throw new Error(`${posix(relative(root, file))}: cannot resolve import '${spec}'`);
        to = posix(relative(root, hit));
      } else {
        to = spec;
      }
      edges.push({ from: posix(relative(root, file)), to });
    }
  }
  return edges;
}

/** A package's name from a bare specifier: '@scope/pkg/sub' → '@scope/pkg', 'pkg/sub' → 'pkg'. */
export const packageOf = (spec: string) => (spec.startsWith('@') ? spec.split('/').slice(0, 2).join('/') : spec.split('/')[0]);

const isServer = (f: string) => f.startsWith('src/lib/server/');
/** Code that may run in the browser, or must stay pure: everything under src/lib except the server, and the components. */
const mustNotReachServer = (f: string) => f.startsWith('src/components/') || (f.startsWith('src/lib/') && !isServer(f));
const isSky = (f: string) => f.startsWith('src/lib/sky/');
/** Build-time generators inside the engine's folder (`build-*.mjs`, e.g. `npm run catalogue`): Node scripts the engine never imports. */
const isSkyTool = (f: string) => /^src\/lib\/sky\/.*\/build-[^/]*\.mjs$/.test(f);
/** What the sky engine may import besides itself. */
const SKY_PACKAGES = new Set(['astronomy-engine']);

/** The one-way rules. Each message names the importing file and what it imported. */
export function ruleViolations(edges: Edge[]): string[] {
  const out: string[] = [];
  for (const { from, to } of edges) {
    if (mustNotReachServer(from) && isServer(to)) out.push(`${from} imports ${to}: browser and pure code must not import src/lib/server/ (put shared shapes in src/lib/contracts/)`);
    if (isSky(from) && !isSkyTool(from) && !isSky(to) && !(to.startsWith('src/') ? false : SKY_PACKAGES.has(packageOf(to)))) {
      out.push(`${from} imports ${to}: the sky engine imports only itself and astronomy-engine`);
    }
  }
  return out;
}

/** Import cycles among the given files (each cycle once, as a list of files). Type-only imports count too. */
export function cycles(edges: Edge[], within: (f: string) => boolean): string[][] {
  const next = new Map<string, string[]>();
  for (const { from, to } of edges) if (within(from) && within(to)) next.set(from, [...(next.get(from) ?? []), to]);
  const found: string[][] = [];
  const seen = new Set<string>();
  const key = (c: string[]) => [...c].sort().join('|');
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (f: string) => {
    state.set(f, 'open');
    stack.push(f);
    for (const t of next.get(f) ?? []) {
      if (state.get(t) === 'open') {
        const c = stack.slice(stack.indexOf(t));
        if (!seen.has(key(c))) {
          seen.add(key(c));
          found.push(c);
        }
      } else if (!state.has(t)) visit(t);
    }
    stack.pop();
    state.set(f, 'done');
  };
  for (const f of next.keys()) if (!state.has(f)) visit(f);
  return found;
}
