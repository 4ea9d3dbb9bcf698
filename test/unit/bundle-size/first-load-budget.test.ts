import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { budgetProblem, firstLoad, type ChunkInfo } from '../../bundle-size/first-load-budget';

const root = '/project';
const gen = `${root}/.svelte-kit/generated/client-optimized`;
/** Incompressible text of about `bytes` (seeded LCG), so gzip sizes are predictable. */
function noise(bytes: number, seed: number): string {
  let s = seed;
  let out = '';
  for (let i = 0; i < bytes; i++) {
    s = (Math.imul(s, 1103515245) + 12345) >>> 0;
    out += String.fromCharCode(33 + (s >>> 16) % 90);
  }
  return out;
}
function chunk(fileName: string, facade: string | null, imports: string[], moduleIds: string[], bytes = 1000): ChunkInfo {
  return { fileName, code: noise(bytes, fileName.length * 7919), imports, moduleIds, facadeModuleId: facade };
}
function app(extra: Partial<Record<string, ChunkInfo>> = {}): ChunkInfo[] {
  return Object.values({
    start: chunk('entry/start.js', `${root}/node_modules/@sveltejs/kit/src/runtime/client/entry.js`, ['shared.js'], []),
    app: chunk('entry/app.js', `${gen}/app.js`, ['shared.js'], []),
    layout: chunk('nodes/0.js', `${gen}/nodes/0.js`, ['shared.js'], [`${root}/src/routes/+layout.svelte`]),
    home: chunk('nodes/3.js', `${gen}/nodes/3.js`, ['home-dep.js'], [`${gen}/nodes/3.js`, `${root}/src/routes/+page.svelte`]),
    homeDep: chunk('home-dep.js', null, [], [`${root}/src/lib/ui/thing.ts`]),
    caseload: chunk('nodes/5.js', `${gen}/nodes/5.js`, ['caseload-dep.js', 'shared.js'], [`${gen}/nodes/5.js`, `${root}/src/routes/patients/+page.svelte`]),
    caseloadDep: chunk('caseload-dep.js', null, [], [`${root}/src/lib/ui/caseload-row.ts`]),
    shared: chunk('shared.js', null, [], [`${root}/node_modules/svelte/src/index.js`]),
    cohort: chunk('nodes/4.js', `${gen}/nodes/4.js`, ['charts.js'], [`${root}/src/routes/cohort/+page.svelte`]),
    charts: chunk('charts.js', null, [], [`${root}/node_modules/uplot/dist/uPlot.esm.js`], 40_000),
    ...extra,
  }) as ChunkInfo[];
}

describe('first-load budget', () => {
  it('counts the entries, root layout, home and caseload pages with their static imports, and nothing else', () => {
    const load = firstLoad(app(), root);
    expect(load.files.map((f) => f.fileName)).toEqual(['caseload-dep.js', 'entry/app.js', 'entry/start.js', 'home-dep.js', 'nodes/0.js', 'nodes/3.js', 'nodes/5.js', 'shared.js']);
    // Sizes from node:zlib directly, file by file.
    const expected = app().filter((c) => load.files.some((f) => f.fileName === c.fileName)).reduce((s, c) => s + gzipSync(c.code, { level: 9 }).length, 0);
    expect(load.gzipBytes).toBe(expected);
    expect(load.forbidden).toEqual([]);
    expect(budgetProblem(load)).toBeNull();
  });

  it('fails with the figure, the budget and the biggest files when the first load is too big', () => {
    const big = app({ homeDep: chunk('home-dep.js', null, [], [`${root}/src/lib/ui/thing.ts`], 170_000) });
    const problem = budgetProblem(firstLoad(big, root));
    expect(problem).toMatch(/^First-load size budget failed: the first screen loads 1\d\d\.\d KB of JavaScript \(gzip\), over the budget of 120 KB; biggest: home-dep\.js/);
  });

  it('fails when uPlot or jsQR is reached by a static import from the first screen', () => {
    const leaky = app({ homeDep: chunk('home-dep.js', null, ['charts.js', 'qr.js'], []), qr: chunk('qr.js', null, [], [`${root}/node_modules/jsqr/dist/jsQR.js`]) });
    const load = firstLoad(leaky, root);
    expect(load.forbidden.map((f) => f.name).sort()).toEqual(['jsQR (QR reader)', 'uPlot (charts)']);
    expect(budgetProblem(load)).toMatch(/uPlot \(charts\) is in the first load \(charts\.js\)/);
  });

  it('refuses to pass when it cannot find the home page (a changed layout must not pass silently)', () => {
    const withoutHome = app().filter((c) => c.fileName !== 'nodes/3.js');
    expect(() => firstLoad(withoutHome, root)).toThrow(/cannot find page node \(src\/routes\/\+page\.svelte\)/);
    // Nor without the caseload, where a set-up device opens.
    expect(() => firstLoad(app().filter((c) => c.fileName !== 'nodes/5.js'), root)).toThrow(/cannot find page node \(src\/routes\/patients\/\+page\.svelte\)/);
  });
});
