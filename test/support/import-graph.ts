// The import graph of src, read from the files themselves (static, type-only and dynamic imports, re-exports),
// folded to the parts of the code base: the folders of src/lib, and routes, cli, server.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { ROOT, landing, partOf } from '../../eslint/lib-folders.js';

export interface ImportSite {
  file: string; // relative to the repository root
  spec: string;
  from: string; // the importer's part
  to: string; // the src/lib folder reached
  door: boolean;
  dynamic: boolean;
}

const SOURCE = /\.(ts|js|svelte)$/;
// `from '…'` (imports and re-exports, one or many lines), bare `import '…'`, and `import('…')`.
const STATIC = /(?:\bfrom\s*|^\s*import\s*)['"]([^'"]+)['"]/gm;
const DYNAMIC = /\bimport\(\s*['"]([^'"]+)['"]\s*\)/g;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(full);
    return SOURCE.test(entry.name) ? [full] : [];
  });
}

/** Every import in `text` (a file's source) that lands in src/lib. */
export function importSites(file: string, text: string): ImportSite[] {
  const from = partOf(file);
  if (from === null) return [];
  const sites: ImportSite[] = [];
  for (const [pattern, dynamic] of [[STATIC, false], [DYNAMIC, true]] as const) {
    for (const match of text.matchAll(pattern)) {
      const spec = match[1];
      const land = landing(file, spec);
      if (land === null) continue;
      sites.push({ file: path.relative(ROOT, file), spec, from, to: land.folder, door: land.door, dynamic });
    }
  }
  return sites;
}

/** Every import in src that lands in src/lib. */
export function readImportSites(srcDir = path.join(ROOT, 'src')): ImportSite[] {
  return sourceFiles(srcDir).flatMap((file) => importSites(file, readFileSync(file, 'utf8')));
}

/** The arrows between parts (importer → imported folder), an importer's own folder left out, sorted. */
export function partArrows(sites: readonly ImportSite[]): string[] {
  const arrows = new Set(sites.filter((s) => s.from !== s.to).map((s) => `${s.from} -> ${s.to}`));
  return [...arrows].sort();
}
