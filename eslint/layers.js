// The layer diagram of DEVELOPERS.md, read as data: the one place that says which part may import which.
// The ESLint rule kinnote/doors refuses an arrow the diagram lacks; test/unit/architecture/layers.test.ts
// fails when the diagram holds an arrow the code lacks, or an arrow that does not point down a layer.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { ROOT } from './lib-folders.js';

export const DIAGRAM_FILE = path.join(ROOT, 'DEVELOPERS.md');
const BEGIN = '<!-- layers:begin -->';
const END = '<!-- layers:end -->';
// One line per part: `<layer> <part> -> <imported part>, <imported part>` (or `-> nothing`).
const LINE = /^\s*(\d+)\s+([\w-]+)\s*->\s*(.*?)\s*$/;

/**
 * @param {string} text the whole of DEVELOPERS.md
 * @returns {{ layerOf: Map<string, number>, arrows: Map<string, Set<string>> }}
 */
export function readLayers(text) {
  const start = text.indexOf(BEGIN);
  const end = text.indexOf(END);
  if (start < 0 || end < start) throw new Error(`DEVELOPERS.md: no layer diagram between ${BEGIN} and ${END}`);
  /** @type {Map<string, number>} */
  const layerOf = new Map();
  /** @type {Map<string, Set<string>>} */
  const arrows = new Map();
  for (const raw of text.slice(start + BEGIN.length, end).split('\n')) {
    const match = LINE.exec(raw);
    if (match === null) continue;
    const [, layer, part, targets] = match;
    if (layerOf.has(part)) throw new Error(`DEVELOPERS.md layer diagram: ${part} is listed twice`);
    layerOf.set(part, Number(layer));
    arrows.set(part, new Set(targets === 'nothing' ? [] : targets.split(',').map((t) => t.trim()).filter(Boolean)));
  }
  return { layerOf, arrows };
}

/** The diagram as it is in DEVELOPERS.md now. */
export const diagramLayers = () => readLayers(readFileSync(DIAGRAM_FILE, 'utf8'));
