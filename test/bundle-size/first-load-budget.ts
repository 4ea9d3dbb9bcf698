// The first-load size budget, checked by the build (vite.config.ts): the JavaScript the first
// screen loads, i.e. the SvelteKit entry chunks, the root layout and the home and caseload page nodes with
// everything they import statically (what index.html and the router fetch before the first paint),
// gzip-compressed (level 9, common practice for a budget), must stay under the budget, and the
// chart library and the QR reader must not be among it (they load with the pages that use them).
import { gzipSync } from 'node:zlib';

export const FIRST_LOAD_BUDGET_BYTES = 120 * 1024;
/**
 * The pages a first launch can open on: home (a device not yet set up) and the caseload (a set-up
 * clinician device opens there). Each one's node, with its static imports, is in the first load.
 */
export const FIRST_SCREENS: readonly string[] = ['src/routes/+page.svelte', 'src/routes/patients/+page.svelte'];
/** Libraries that must never be in the first load, by a path fragment of their modules. */
export const KEPT_OUT_OF_FIRST_LOAD: readonly { name: string; path: string }[] = [
  { name: 'uPlot (charts)', path: '/node_modules/uplot/' },
  { name: 'jsQR (QR reader)', path: '/node_modules/jsqr/' },
  { name: 'pdf-lib (the report PDF)', path: '/node_modules/pdf-lib/' },
];

/** What the check needs of one output chunk (Rollup/Rolldown OutputChunk has these fields). */
export interface ChunkInfo {
  readonly fileName: string;
  readonly code: string;
  readonly imports: readonly string[];
  readonly moduleIds: readonly string[];
  readonly facadeModuleId: string | null;
}

export interface FirstLoad {
  readonly files: readonly { fileName: string; gzipBytes: number }[];
  readonly gzipBytes: number;
  /** Libraries found in the first load that must not be there. */
  readonly forbidden: readonly { name: string; fileName: string }[];
}

const isRoot = (facade: string | null, pattern: RegExp) => facade !== null && pattern.test(facade.replaceAll('\\', '/'));

/**
 * The first load of a SvelteKit client build: the chunks whose facade is the client entry, the
 * generated app, nodes/0 (root layout) or a node holding one of FIRST_SCREENS, closed over
 * static imports. Throws Error when the roots cannot be found (a changed SvelteKit layout must not
 * pass the budget silently).
 */
export function firstLoad(chunks: readonly ChunkInfo[], projectRoot: string): FirstLoad {
  const byName = new Map(chunks.map((c) => [c.fileName, c]));
  const base = projectRoot.replaceAll('\\', '/');
  const pageNode = (c: ChunkInfo, page: string) => isRoot(c.facadeModuleId, /\/generated\/client-optimized\/nodes\/\d+\.js$/) && c.moduleIds.some((m) => m.replaceAll('\\', '/') === `${base}/${page}`);
  const roots = chunks.filter(
    (c) =>
      isRoot(c.facadeModuleId, /\/kit\/src\/runtime\/client\/entry\.js$/) ||
      isRoot(c.facadeModuleId, /\/generated\/client-optimized\/app\.js$/) ||
      isRoot(c.facadeModuleId, /\/generated\/client-optimized\/nodes\/0\.js$/) ||
      FIRST_SCREENS.some((page) => pageNode(c, page)),
  );
  const found = (re: RegExp) => roots.some((c) => isRoot(c.facadeModuleId, re));
  const missing = [
    ['client entry', /\/kit\/src\/runtime\/client\/entry\.js$/],
    ['app', /\/client-optimized\/app\.js$/],
    ['root layout (nodes/0)', /\/client-optimized\/nodes\/0\.js$/],
  ].filter(([, re]) => !found(re as RegExp)).map(([name]) => name);
  for (const page of FIRST_SCREENS) if (!chunks.some((c) => pageNode(c, page))) missing.push(`page node (${page})`);
  if (missing.length > 0) throw new Error(`first-load budget: cannot find ${missing.join(', ')} among the ${chunks.length} client chunks`);
  const seen = new Set<string>();
  const stack = roots.map((c) => c.fileName);
  while (stack.length > 0) {
    const name = stack.pop() as string;
    if (seen.has(name)) continue;
    seen.add(name);
    for (const next of byName.get(name)?.imports ?? []) if (byName.has(next)) stack.push(next);
  }
  const files = [...seen].sort().map((fileName) => ({ fileName, gzipBytes: gzipSync(byName.get(fileName)!.code, { level: 9 }).length }));
  const forbidden: { name: string; fileName: string }[] = [];
  for (const fileName of seen) {
    const ids = byName.get(fileName)!.moduleIds.map((m) => m.replaceAll('\\', '/'));
    for (const lib of KEPT_OUT_OF_FIRST_LOAD) if (ids.some((m) => m.includes(lib.path))) forbidden.push({ name: lib.name, fileName });
  }
  return { files, gzipBytes: files.reduce((sum, f) => sum + f.gzipBytes, 0), forbidden };
}

/** The build's verdict: null when within budget, else a message naming the figure, the budget and the biggest files. */
export function budgetProblem(load: FirstLoad, budgetBytes = FIRST_LOAD_BUDGET_BYTES): string | null {
  const problems: string[] = [];
  if (load.gzipBytes > budgetBytes) {
    const biggest = [...load.files].sort((a, b) => b.gzipBytes - a.gzipBytes).slice(0, 5).map((f) => `${f.fileName} ${(f.gzipBytes / 1024).toFixed(1)} KB`);
    problems.push(
      `the first screen loads ${(load.gzipBytes / 1024).toFixed(1)} KB of JavaScript (gzip), over the budget of ${(budgetBytes / 1024).toFixed(0)} KB; biggest: ${biggest.join(', ')}. Move what the first screen does not need behind a dynamic import()`,
    );
  }
  for (const f of load.forbidden) problems.push(`${f.name} is in the first load (${f.fileName}); import it dynamically from the page that needs it`);
  return problems.length === 0 ? null : `First-load size budget failed: ${problems.join('; ')}`;
}
