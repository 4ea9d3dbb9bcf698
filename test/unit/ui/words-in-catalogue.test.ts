// Every word a patient or a therapist reads on the screens in COVERED (patient mode, the programme
// screens, and the therapist's first screen, menu, caseload, new patient, settings, cohort audit,
// reliability studies and shared components) comes from a message catalogue (a `…-messages.ts`
// module), never from a page.
// The pages are read as the Svelte compiler reads them: text between tags, the attributes a
// person reads (placeholder, title, alt, aria-label, any static attribute given to a component),
// and the strings in the script that look like prose. A page that writes such words fails here,
// naming the file, the line and the words. The checker itself is tried on planted strings below,
// so this test cannot pass by finding nothing.
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { parse } from 'svelte/compiler';
import { describe, expect, it } from 'vitest';

const ROOT = join(__dirname, '../../..');

/**
 * The screens whose words must all be in a catalogue: patient mode, the shared programme components,
 * the therapist's patient page (home-log timeline, visit form, report, saved swing, programme editor and
 * hand-over),
 * the measuring instruments and their pages, the drafts list the programme editor shows, the therapist's
 * first screen, menu, caseload, new-patient form, settings (with its team section), reliability studies,
 * cohort audit, the shared components of lib/ui, and the charts.
 */
const COVERED = [
  'src/routes/home-programme',
  'src/lib/ui/programme',
  'src/routes/patients/[id]',
  'src/routes/measure',
  'src/lib/ui/instruments',
  'src/lib/ui/OtherDrafts.svelte',
  'src/routes/+page.svelte',
  'src/routes/+layout.svelte',
  'src/routes/patients/+page.svelte',
  'src/routes/patients/CaseloadRow.svelte',
  'src/routes/patients/caseload-loader.ts',
  'src/routes/patients/new',
  'src/routes/settings',
  'src/routes/reliability',
  'src/routes/cohort',
  'src/lib/ui/UnlockPanel.svelte',
  'src/lib/ui/SetupDevice.svelte',
  'src/lib/ui/UpdateBanner.svelte',
  'src/lib/ui/ChoiceButtons.svelte',
  'src/lib/ui/VirtualList.svelte',
  'src/lib/ui/ReanalysisNotice.svelte',
  'src/lib/ui/team',
  'src/lib/charts',
];
/** The catalogues themselves (where the words belong): every module named `…-messages.ts` (or `…-messages-es.ts`). */
const CATALOGUES = /-messages(?:-es)?\.ts$/;

interface Finding {
  readonly line: number;
  readonly words: string;
}

// Human words: a run of two lower-case letters (so "XXXXX-XXXXX", a code's shape, is not words),
// or a capitalised word standing alone ("Shared."). Class names, ids and keys have no spaces and
// are lower-case, so a script string counts as prose only with a space between letters or when
// it is a capitalised word.
// The app's own name is the same in every language and is left out.
const withoutName = (s: string) => s.replaceAll('Kinnote', '');
const hasWords = (s: string) => /\p{Ll}{2}/u.test(withoutName(s));
const PROSE_STRING = (s: string) => (/\p{L}\s+\p{L}/u.test(withoutName(s)) && hasWords(s)) || /^\p{Lu}\p{Ll}+[.…!?:]?$/u.test(withoutName(s).trim());
/** Attributes a person reads (on elements); any static attribute with words given to a component is read too. */
const READ_ATTRIBUTES = new Set(['placeholder', 'title', 'alt', 'aria-label', 'aria-description', 'aria-valuetext', 'label']);

type Node = { type: string; start?: number; [key: string]: unknown };

function lineOf(source: string, offset: number): number {
  return source.slice(0, offset).split('\n').length;
}

/** Walks an AST (template or ESTree), skipping TypeScript-only nodes, import sources and object keys. */
function walk(node: unknown, visit: (n: Node, parent: Node | null) => void, parent: Node | null = null): void {
  if (Array.isArray(node)) {
    for (const child of node) walk(child, visit, parent);
    return;
  }
  if (node === null || typeof node !== 'object') return;
  const n = node as Node;
  if (typeof n.type === 'string') {
    if (n.type.startsWith('TS') || n.type === 'ImportDeclaration' || n.type === 'ExportAllDeclaration') return;
    visit(n, parent);
  }
  for (const [key, value] of Object.entries(n)) {
    if (key === 'parent' || key === 'metadata' || key === 'loc' || key === 'typeAnnotation' || key === 'returnType') continue;
    // An object's keys are names, not words: `{ title: 'Title' }` checks 'Title' only.
    if (n.type === 'Property' && key === 'key' && !n.computed) continue;
    // A module's source in a dynamic import is a path.
    if (n.type === 'ImportExpression' && key === 'source') continue;
    walk(value, visit, typeof n.type === 'string' ? n : parent);
  }
}

/** The words a Svelte component or TypeScript module writes itself (empty: all from catalogues). */
export function wordsWrittenIn(source: string, kind: 'svelte' | 'ts'): Finding[] {
  // A .ts module is read through the same parser as a component's script (Svelte parses TypeScript).
  const prefix = kind === 'ts' ? '<script lang="ts">' : '';
  const text = kind === 'ts' ? `${prefix}${source.replaceAll('</script>', '<\\/script>')}</script>` : source;
  const ast = parse(text, { modern: true }) as unknown as { fragment: unknown; instance: { content: unknown } | null; module: { content: unknown } | null };
  const found: Finding[] = [];
  const add = (offset: number, words: string) => found.push({ line: lineOf(text, offset), words: words.trim().replace(/\s+/g, ' ') });
  walk(ast.fragment, (n, parent) => {
    // A style directive's text is CSS (`style:height="{h}px"`), never read as words.
    if (n.type === 'Text' && hasWords(String(n.data)) && parent?.type !== 'Attribute' && parent?.type !== 'StyleDirective') add(n.start ?? 0, String(n.data));
    if (n.type === 'Attribute' && Array.isArray(n.value)) {
      const owner = parent?.type;
      const read = READ_ATTRIBUTES.has(String(n.name)) || owner === 'Component';
      if (!read) return;
      for (const part of n.value as Node[]) if (part.type === 'Text' && hasWords(String(part.data)) && (owner !== 'Component' || PROSE_STRING(String(part.data)))) add(part.start ?? 0, `${String(n.name)}="${String(part.data)}"`);
    }
  });
  const scripts = [ast.instance?.content, ast.module?.content, ast.fragment];
  for (const script of scripts) {
    walk(script, (n, parent) => {
      // A string compared with === or !== is a key (an error code such as 'Aborted'), never shown.
      const compared = parent?.type === 'BinaryExpression' && (parent.operator === '===' || parent.operator === '!==');
      if (n.type === 'Literal' && typeof n.value === 'string' && !compared && PROSE_STRING(n.value)) add(n.start ?? 0, n.value);
      if (n.type === 'TemplateElement') {
        const cooked = (n.value as { cooked?: string }).cooked ?? '';
        if (PROSE_STRING(cooked)) add(n.start ?? 0, cooked);
      }
    });
  }
  return found;
}

function filesUnder(folder: string): string[] {
  if (!statSync(folder).isDirectory()) return [folder];
  const out: string[] = [];
  for (const name of readdirSync(folder)) {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) out.push(...filesUnder(path));
    else if (/\.(svelte|ts)$/.test(name) && !CATALOGUES.test(name)) out.push(path);
  }
  return out.sort();
}

describe('words in the message catalogue', () => {
  it('finds words planted in a page, in each place a person reads them', () => {
    // Each planted string must be found; a checker that finds nothing would let every page pass.
    const planted = `<script lang="ts">
  import { m } from './x';
  let saved = $state<string | null>(null);
  const title = 'Home stretching programme';
  function done() { saved = \`Programme saved for \${m.code}\`; }
  async function drop() { if (!confirm('Discard the changes?')) return; }
  const short = 'Saved.';
</script>
<h2>{saved ? m.edit : 'Write a programme'}</h2>
<p class="hint">Fill in only what you prescribe.</p>
<input placeholder="e.g. each side" />
<button aria-label="Remove exercise">×</button>
<OtherDrafts subject="of this programme" kind="programme" />
`;
    const words = wordsWrittenIn(planted, 'svelte').map((f) => f.words);
    expect(words).toEqual(
      expect.arrayContaining([
        'Home stretching programme',
        'Programme saved for',
        'Discard the changes?',
        'Saved.',
        'Write a programme',
        'Fill in only what you prescribe.',
        'placeholder="e.g. each side"',
        'aria-label="Remove exercise"',
        'subject="of this programme"',
      ]),
    );
    // Names a person never reads are not words: classes, keys, ids, paths, a code's shape.
    expect(words.join(' | ')).not.toMatch(/hint|kind=|\.\/x/);
    expect(wordsWrittenIn('<input class="big code" name="handover-language" placeholder="XXXXX-XXXXX" />', 'svelte')).toEqual([]);
    expect(wordsWrittenIn('<li style:top="{top}px" style:height="{h}px">{label}</li>', 'svelte')).toEqual([]);
    // A compared string is a key; the same string shown is found.
    expect(wordsWrittenIn("const cancelled = e.code === 'Aborted';\nconst shown = 'Aborted';\n", 'ts')).toEqual([{ line: 2, words: 'Aborted' }]);
    // A module's prose is found too, with its line.
    expect(wordsWrittenIn("const a = { title: 'Title' };\nexport const b = `Exercise ${1}, hold`;\n", 'ts')).toEqual([
      { line: 1, words: 'Title' },
      { line: 2, words: 'Exercise' },
    ]);
  });

  it('has no words written in the covered patient and therapist screens', () => {
    const written: string[] = [];
    for (const folder of COVERED) {
      for (const file of filesUnder(join(ROOT, folder))) {
        const kind = file.endsWith('.svelte') ? 'svelte' : 'ts';
        for (const f of wordsWrittenIn(readFileSync(file, 'utf8'), kind)) written.push(`${relative(ROOT, file)}:${f.line}: ${f.words}`);
      }
    }
    expect(written, 'words written in a page instead of a catalogue').toEqual([]);
  });
});
