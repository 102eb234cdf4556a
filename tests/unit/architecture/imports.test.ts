/**
 * Imports point one way: browser and pure code never reach into src/lib/server/, the sky engine imports
 * only itself and astronomy-engine, and no module imports itself back through others.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { cycles, importGraph, ruleViolations, type Edge } from './import-graph';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const graph = importGraph(root);

describe('import rules over src/', () => {
  it('reads the graph (sanity: known edges are present)', () => {
    expect(graph.length).toBeGreaterThan(500);
    expect(graph).toContainEqual({ from: 'src/lib/server/policy.ts', to: 'src/lib/contracts/roles.ts' });
    expect(graph).toContainEqual({ from: 'src/lib/sky/astronomy.ts', to: 'astronomy-engine' });
  });

  it('no browser or pure module imports the server, and the sky engine stays self-contained', () => {
    expect(ruleViolations(graph)).toEqual([]);
  });

  it('has no import cycles', () => {
    expect(cycles(graph, (f) => f.startsWith('src/'))).toEqual([]);
  });
});

describe('the rules catch what they are meant to catch', () => {
  const bad: Edge[] = [
    { from: 'src/components/scenes/EditorPanel.tsx', to: 'src/lib/server/http.ts' },
    { from: 'src/lib/client/api.ts', to: 'src/lib/server/scene-service.ts' },
    { from: 'src/lib/contracts/scene.ts', to: 'src/lib/server/db/schema/index.ts' },
    { from: 'src/lib/imports/csv.ts', to: 'src/lib/server/http.ts' },
    { from: 'src/lib/sky/envelope.ts', to: 'zod' },
    { from: 'src/lib/sky/observe.ts', to: 'src/lib/contracts/scene-doc.ts' },
    { from: 'src/lib/sky/time.ts', to: 'node:fs' },
  ];
  const fine: Edge[] = [
    { from: 'src/lib/server/policy.ts', to: 'src/lib/contracts/roles.ts' },
    { from: 'src/pages/api/health.ts', to: 'src/lib/server/http.ts' },
    { from: 'src/components/ui/Button.tsx', to: 'react' },
    { from: 'src/lib/sky/astronomy.ts', to: 'astronomy-engine' },
    { from: 'src/lib/sky/observe.ts', to: 'src/lib/sky/frames.ts' },
    { from: 'src/lib/sky/catalogue/build-catalogue.mjs', to: 'node:fs' },
  ];

  it('flags each bad edge once, naming the file and the import', () => {
    const v = ruleViolations(bad);
    expect(v).toHaveLength(bad.length);
    bad.forEach((e, i) => expect(v[i]).toContain(`${e.from} imports ${e.to}`));
  });

  it('lets allowed edges through', () => {
    expect(ruleViolations(fine)).toEqual([]);
  });

  it('finds a two-module cycle and a three-module cycle', () => {
    const c = cycles(
      [
        { from: 'src/lib/server/accounts.ts', to: 'src/lib/server/teams.ts' },
        { from: 'src/lib/server/teams.ts', to: 'src/lib/server/accounts.ts' },
        { from: 'a.ts', to: 'b.ts' },
        { from: 'b.ts', to: 'c.ts' },
        { from: 'c.ts', to: 'a.ts' },
        { from: 'c.ts', to: 'd.ts' },
      ],
      () => true,
    );
    expect(c.map((x) => [...x].sort())).toEqual([
      ['src/lib/server/accounts.ts', 'src/lib/server/teams.ts'],
      ['a.ts', 'b.ts', 'c.ts'],
    ]);
  });
});
