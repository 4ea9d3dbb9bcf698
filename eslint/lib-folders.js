// Where an import lands, in terms of src/lib's folders and their doors (index.ts).
// Shared by the ESLint door rule (eslint/doors-rule.js) and the import-graph test (test/unit/architecture).
import path from 'node:path';

/** The repository root (this file lives in <root>/eslint). */
export const ROOT = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');
export const LIB = path.join(ROOT, 'src', 'lib');

/**
 * The part of the code base a file belongs to: a folder of src/lib ('store', 'ui', ...), or 'routes', 'cli',
 * 'server' for the rest of src; null outside src.
 * @param {string} file absolute path
 * @returns {string | null}
 */
export function partOf(file) {
  const fromLib = path.relative(LIB, file);
  if (!fromLib.startsWith('..') && !path.isAbsolute(fromLib)) {
    const [head, ...rest] = fromLib.split(path.sep);
    return rest.length > 0 ? head : null;
  }
  const fromSrc = path.relative(path.join(ROOT, 'src'), file);
  if (fromSrc.startsWith('..') || path.isAbsolute(fromSrc)) return null;
  const [head, ...rest] = fromSrc.split(path.sep);
  return rest.length > 0 ? head : null;
}

/**
 * Where an import specifier written in `fromFile` lands, when it lands in src/lib.
 * @param {string} fromFile absolute path of the importing file
 * @param {string} spec the specifier as written
 * @returns {{ folder: string, inner: string, door: boolean, viaLib: boolean } | null}
 *   folder: the src/lib folder reached; inner: the path inside it ('' for the folder itself);
 *   door: whether that is the folder's index; viaLib: written with `$lib`. Null for packages and other places.
 */
export function landing(fromFile, spec) {
  let target;
  if (spec === '$lib' || spec.startsWith('$lib/')) target = path.join(LIB, spec.slice(4));
  else if (spec.startsWith('./') || spec.startsWith('../')) target = path.resolve(path.dirname(fromFile), spec);
  else return null;
  const rel = path.relative(LIB, target);
  if (rel === '' || rel.startsWith('..') || path.isAbsolute(rel)) return null;
  const [folder, ...rest] = rel.split(path.sep);
  const inner = rest.join('/');
  const door = inner === '' || /^index(\.(ts|js))?$/.test(inner);
  return { folder, inner, door, viaLib: spec.startsWith('$lib') };
}
