// The names each folder's door (src/lib/<folder>/index.ts) exports, and the names the rest of src takes through
// those doors, read with the TypeScript parser (syntax only: no type checking, so it runs in well under a second).
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { LIB, ROOT, landing, partOf } from '../../eslint/lib-folders.js';

const SOURCE = /\.(ts|js|svelte)$/;
const SCRIPT = /<script\b[^>]*>([\s\S]*?)<\/script>/g;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(full);
    return SOURCE.test(entry.name) ? [full] : [];
  });
}

/** The script a file holds: a .svelte file's <script> blocks, or the whole of a .ts/.js file. */
function scriptOf(file: string, text: string): string {
  return file.endsWith('.svelte') ? [...text.matchAll(SCRIPT)].map((m) => m[1]).join('\n') : text;
}

function parse(file: string, text: string): ts.SourceFile {
  return ts.createSourceFile(file, text, ts.ScriptTarget.Latest, false, ts.ScriptKind.TS);
}

const MODULE_FILES = ['.ts', '.js', '/index.ts'];

function resolveModule(fromFile: string, spec: string): string | null {
  const base = path.resolve(path.dirname(fromFile), spec);
  for (const candidate of [base, ...MODULE_FILES.map((ext) => base + ext)]) {
    if (existsSync(candidate) && SOURCE.test(candidate)) return candidate;
  }
  return null;
}

const hasExport = (node: ts.Node) =>
  ts.canHaveModifiers(node) && (ts.getModifiers(node) ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword);

/**
 * The names a module exports (`export { a as b }`, `export const/function/class/type/interface/enum`,
 * `export default`), following `export * from './x'` into the files it names.
 */
export function moduleExports(file: string, text = readFileSync(file, 'utf8'), seen = new Set<string>()): Set<string> {
  const names = new Set<string>();
  if (seen.has(file)) return names;
  seen.add(file);
  for (const node of parse(file, text).statements) {
    if (ts.isExportDeclaration(node)) {
      if (node.exportClause && ts.isNamedExports(node.exportClause)) {
        for (const el of node.exportClause.elements) names.add(el.name.text);
      } else if (node.exportClause && ts.isNamespaceExport(node.exportClause)) {
        names.add(node.exportClause.name.text);
      } else if (node.moduleSpecifier && ts.isStringLiteral(node.moduleSpecifier)) {
        const target = resolveModule(file, node.moduleSpecifier.text);
        if (target === null) throw new Error(`${path.relative(ROOT, file)}: cannot follow export * from '${node.moduleSpecifier.text}'`);
        for (const name of moduleExports(target, readFileSync(target, 'utf8'), seen)) if (name !== 'default') names.add(name);
      }
    } else if (ts.isExportAssignment(node)) {
      names.add('default');
    } else if (hasExport(node)) {
      if (ts.isVariableStatement(node)) {
        for (const decl of node.declarationList.declarations) if (ts.isIdentifier(decl.name)) names.add(decl.name.text);
      } else if (
        (ts.isFunctionDeclaration(node) || ts.isClassDeclaration(node) || ts.isInterfaceDeclaration(node) ||
          ts.isTypeAliasDeclaration(node) || ts.isEnumDeclaration(node)) && node.name
      ) {
        names.add(node.name.text);
      }
    }
  }
  return names;
}

/** One name taken through a door: who takes it (file, relative to the root) and from which folder's door. */
export interface DoorUse {
  file: string;
  folder: string;
  name: string; // '*' when the whole door is taken (`import * as`, `export * from`)
}

/**
 * The names `file` (whose source is `text`) takes through another folder's door: named and default imports,
 * `import * as`, re-exports, and, for a dynamic `import()` of a door, every word of the file that the door exports
 * (what a destructured `await import(…)` takes cannot be read from the import alone).
 */
export function doorUses(file: string, text: string, doorNames: (folder: string) => Set<string>): DoorUse[] {
  const part = partOf(file) ?? 'src';
  const rel = path.relative(ROOT, file);
  const script = scriptOf(file, text);
  const uses: DoorUse[] = [];
  const doorOf = (spec: string): string | null => {
    const land = landing(file, spec);
    return land !== null && land.door && land.folder !== part ? land.folder : null;
  };
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node) && ts.isStringLiteral(node.moduleSpecifier)) {
      const folder = doorOf(node.moduleSpecifier.text);
      const clause = node.importClause;
      if (folder !== null && clause) {
        if (clause.name) uses.push({ file: rel, folder, name: 'default' });
        const bindings = clause.namedBindings;
        if (bindings && ts.isNamespaceImport(bindings)) uses.push({ file: rel, folder, name: '*' });
        if (bindings && ts.isNamedImports(bindings)) {
          for (const el of bindings.elements) uses.push({ file: rel, folder, name: (el.propertyName ?? el.name).text });
        }
      }
    } else if (ts.isExportDeclaration(node) && node.moduleSpecifier && ts.isStringLiteral(node.moduleSpecifier)) {
      const folder = doorOf(node.moduleSpecifier.text);
      if (folder !== null) {
        if (node.exportClause && ts.isNamedExports(node.exportClause)) {
          for (const el of node.exportClause.elements) uses.push({ file: rel, folder, name: (el.propertyName ?? el.name).text });
        } else {
          uses.push({ file: rel, folder, name: '*' });
        }
      }
    } else if (
      ts.isCallExpression(node) && node.expression.kind === ts.SyntaxKind.ImportKeyword &&
      node.arguments.length === 1 && ts.isStringLiteral(node.arguments[0])
    ) {
      const folder = doorOf(node.arguments[0].text);
      if (folder !== null) {
        const words = new Set(text.match(/[A-Za-z_$][\w$]*/g) ?? []);
        for (const name of doorNames(folder)) if (words.has(name)) uses.push({ file: rel, folder, name });
      }
    }
    ts.forEachChild(node, visit);
  };
  visit(parse(file, script));
  return uses;
}

/** The folders of src/lib that have a door. */
export function doorFolders(): string[] {
  return readdirSync(LIB, { withFileTypes: true })
    .filter((e) => e.isDirectory() && existsSync(path.join(LIB, e.name, 'index.ts')))
    .map((e) => e.name)
    .sort();
}

/** Every door's exported names, by folder. */
export function readDoorExports(): Map<string, Set<string>> {
  return new Map(doorFolders().map((folder) => [folder, moduleExports(path.join(LIB, folder, 'index.ts'))]));
}

/** Every name src takes through a door other than its own folder's. */
export function readDoorUses(doors: Map<string, Set<string>>, srcDir = path.join(ROOT, 'src')): DoorUse[] {
  const namesOf = (folder: string) => doors.get(folder) ?? new Set<string>();
  return sourceFiles(srcDir).flatMap((file) => doorUses(file, readFileSync(file, 'utf8'), namesOf));
}

/** The names a door exports that nothing outside its folder takes, as `folder: name`, sorted. */
export function unusedDoorNames(doors: Map<string, Set<string>>, uses: readonly DoorUse[]): string[] {
  const taken = new Set(uses.map((u) => `${u.folder}: ${u.name}`));
  const unused: string[] = [];
  for (const [folder, names] of doors) {
    if (taken.has(`${folder}: *`)) continue;
    for (const name of names) if (!taken.has(`${folder}: ${name}`)) unused.push(`${folder}: ${name}`);
  }
  return unused.sort();
}
