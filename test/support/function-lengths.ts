// Measures the length of every function in a TypeScript source tree with the TypeScript compiler's own
// parser (no regular expressions over code): function declarations, methods, accessors, constructors,
// function expressions and arrow functions. Used by test/unit/function-length.test.ts and runnable as
// `npx tsx test/support/function-lengths.ts [folder] [limit]` to list the long ones.

import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import ts from 'typescript';

export interface FunctionLength {
  /** Path relative to the scanned root's parent folder, with forward slashes, e.g. "src/lib/stats/x.ts". */
  readonly file: string;
  /** The function's name, `Class.method`, the variable an arrow is assigned to, or `(anonymous)`. */
  readonly name: string;
  /** 1-based line of the function's first line. */
  readonly line: number;
  /** Lines from the function's first to its last, both included. */
  readonly lines: number;
}

function nameOf(node: ts.Node): string {
  if ((ts.isFunctionDeclaration(node) || ts.isFunctionExpression(node)) && node.name) return node.name.text;
  if (ts.isMethodDeclaration(node) || ts.isGetAccessorDeclaration(node) || ts.isSetAccessorDeclaration(node)) {
    const owner = ts.isClassLike(node.parent) && node.parent.name ? `${node.parent.name.text}.` : '';
    return `${owner}${node.name.getText()}`;
  }
  if (ts.isConstructorDeclaration(node)) return `${ts.isClassLike(node.parent) && node.parent.name ? node.parent.name.text : ''}.constructor`;
  const parent = node.parent;
  if (parent && ts.isVariableDeclaration(parent) && ts.isIdentifier(parent.name)) return parent.name.text;
  if (parent && ts.isPropertyAssignment(parent)) return parent.name.getText();
  return '(anonymous)';
}

function isFunctionLike(node: ts.Node): boolean {
  return (
    ts.isFunctionDeclaration(node) ||
    ts.isFunctionExpression(node) ||
    ts.isArrowFunction(node) ||
    ts.isMethodDeclaration(node) ||
    ts.isGetAccessorDeclaration(node) ||
    ts.isSetAccessorDeclaration(node) ||
    ts.isConstructorDeclaration(node)
  );
}

/** Every function in one file's text, nested ones included (each counted on its own, from its own first line). */
export function functionLengthsOfText(file: string, text: string): FunctionLength[] {
  const source = ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true, ts.ScriptKind.TS);
  const found: FunctionLength[] = [];
  const visit = (node: ts.Node): void => {
    if (isFunctionLike(node) && (node as ts.FunctionLikeDeclaration).body) {
      const first = source.getLineAndCharacterOfPosition(node.getStart(source)).line;
      const last = source.getLineAndCharacterOfPosition(node.getEnd()).line;
      found.push({ file, name: nameOf(node), line: first + 1, lines: last - first + 1 });
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

function tsFiles(folder: string): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(folder).sort()) {
    const path = join(folder, entry);
    if (statSync(path).isDirectory()) out.push(...tsFiles(path));
    else if (entry.endsWith('.ts') && !entry.endsWith('.d.ts')) out.push(path);
  }
  return out;
}

/** Every function over `limit` lines in the .ts files under `folder` (Svelte files are not read), longest first. */
export function longFunctions(folder: string, limit: number, base = join(folder, '..', '..')): FunctionLength[] {
  return tsFiles(folder)
    .flatMap((path) => functionLengthsOfText(relative(base, path).split('\\').join('/'), readFileSync(path, 'utf8')))
    .filter((f) => f.lines > limit)
    .sort((a, b) => b.lines - a.lines || a.file.localeCompare(b.file));
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('\\').join('/').split('/').pop() ?? '\0')) {
  const folder = process.argv[2] ?? 'src/lib';
  const limit = Number(process.argv[3] ?? 80);
  for (const f of longFunctions(folder, limit, process.cwd())) console.log(`${String(f.lines).padStart(4)}  ${f.file}:${f.line}  ${f.name}`);
}
