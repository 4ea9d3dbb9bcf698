// The layer diagram in DEVELOPERS.md and the code's import graph agree, arrow for arrow, and every arrow points
// down a layer. (ESLint refuses a new arrow the diagram lacks; this test also catches arrows the code dropped.)
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readLayers, diagramLayers } from '../../../eslint/layers.js';
import { LIB, ROOT } from '../../../eslint/lib-folders.js';
import { importSites, partArrows, readImportSites } from '../../support/import-graph';

const diagramArrows = (arrows: Map<string, Set<string>>) => [...arrows].flatMap(([from, to]) => [...to].map((t) => `${from} -> ${t}`)).sort();

describe('the layer diagram', () => {
  const { layerOf, arrows } = diagramLayers();

  it('shows every arrow the code has and none it does not', () => {
    expect(diagramArrows(arrows)).toEqual(partArrows(readImportSites()));
  });

  it('places every folder of src/lib, and routes, cli and server, on a layer', () => {
    const libFolders = readdirSync(LIB, { withFileTypes: true }).filter((e) => e.isDirectory()).map((e) => e.name);
    expect([...layerOf.keys()].sort()).toEqual([...libFolders, 'routes', 'cli', 'server'].sort());
  });

  it('has every arrow pointing down a layer', () => {
    const upOrLevel = diagramArrows(arrows).filter((a) => {
      const [from, to] = a.split(' -> ');
      return !(layerOf.get(from)! > (layerOf.get(to) ?? Infinity));
    });
    expect(upOrLevel).toEqual([]);
  });

  it('gives every folder a door (index.ts) and reaches other folders only through it', () => {
    const libFolders = readdirSync(LIB, { withFileTypes: true }).filter((e) => e.isDirectory()).map((e) => e.name);
    expect(libFolders.filter((f) => !existsSync(path.join(LIB, f, 'index.ts')))).toEqual([]);
    // A style sheet is no module with names; dynamic imports by path are the lint's on-demand list.
    const past = readImportSites().filter((s) => s.from !== s.to && !s.door && !s.dynamic && !s.spec.endsWith('.css'));
    expect(past.map((s) => `${s.file}: ${s.spec}`)).toEqual([]);
  });
});

describe('the checks can fail', () => {
  it('an import the diagram lacks shows as a difference', () => {
    const file = path.join(ROOT, 'src/lib/stats/example.ts');
    const sites = importSites(file, "import { a } from '../domain';\nimport type { B } from '$lib/store';\nconst c = await import('../ui');");
    expect(partArrows(sites)).toEqual(['stats -> domain', 'stats -> store', 'stats -> ui']);
    const { arrows } = readLayers('<!-- layers:begin -->\n  1 stats -> domain\n  0 domain -> nothing\n<!-- layers:end -->');
    expect(diagramArrows(arrows)).not.toEqual(partArrows(sites));
  });

  it('an import past a door is seen, a door import is not', () => {
    const file = path.join(ROOT, 'src/routes/x/+page.svelte');
    const sites = importSites(file, "<script>\n  import X from '$lib/ui/X.svelte';\n  import { y } from '$lib/ui';\n</script>");
    expect(sites.map((s) => [s.spec, s.door])).toEqual([['$lib/ui/X.svelte', false], ['$lib/ui', true]]);
  });

  it('refuses a diagram without its markers', () => {
    expect(() => readLayers('no diagram here')).toThrow(/no layer diagram/);
  });
});
