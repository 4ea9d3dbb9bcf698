// ESLint rule `kinnote/doors`: another folder of src/lib is entered only through its door (its index.ts),
// and a folder's own files import each other by relative path. DEVELOPERS.md, "Doors", says why.
import path from 'node:path';
import { LIB, landing, partOf } from './lib-folders.js';

/**
 * How the importing file should name a folder's door: `$lib/x` in the app, a relative path in cli and server.
 * @param {string} fromFile
 * @param {string} folder
 */
function doorSpec(fromFile, folder) {
  const part = partOf(fromFile);
  if (part === 'cli' || part === 'server') {
    const rel = path.relative(path.dirname(fromFile), path.join(LIB, folder)).split(path.sep).join('/');
    return rel.startsWith('.') ? rel : `./${rel}`;
  }
  return `$lib/${folder}`;
}

const stripExtension = (/** @type {string} */ inner) => inner.replace(/\.(ts|js)$/, '');

/** @type {import('eslint').Rule.RuleModule} */
export const doorsRule = {
  meta: {
    type: 'problem',
    docs: { description: 'Enter another src/lib folder only through its index.ts; inside a folder, import relatively.' },
    schema: [
      {
        type: 'object',
        properties: {
          // Modules that a dynamic import() may load by their own path (code loaded on demand, kept out of the
          // first screen's chunks), written 'folder/file' without extension.
          onDemand: { type: 'array', items: { type: 'string' } },
          // The layer diagram's arrows (eslint/layers.js reads them from DEVELOPERS.md): part -> parts it may import.
          arrows: { type: 'object', additionalProperties: { type: 'array', items: { type: 'string' } } },
        },
        additionalProperties: false,
      },
    ],
    messages: {
      pastDoor:
        "'{{spec}}' goes past the door of src/lib/{{folder}}: import from '{{door}}' (add the name to src/lib/{{folder}}/index.ts if it is not exported there).",
      pastDoorDynamic:
        "import('{{spec}}') goes past the door of src/lib/{{folder}}: load '{{door}}', or list '{{folder}}/{{inner}}' as on demand in .eslint.config.js (kinnote/doors) and DEVELOPERS.md.",
      noArrow:
        "src/{{fromPath}} may not import src/lib/{{folder}}: the layer diagram in DEVELOPERS.md has no arrow {{from}} -> {{folder}} (add it there only if it points down a layer).",
      ownDoor: "'{{spec}}' is in this file's own folder (src/lib/{{folder}}): import it by a relative path ('./…'), never through $lib.",
    },
  },
  create(context) {
    const file = context.filename;
    const from = partOf(file);
    if (from === null) return {};
    const onDemand = new Set(context.options[0]?.onDemand ?? []);
    /** @type {Record<string, string[]> | undefined} */
    const arrows = context.options[0]?.arrows;
    const inLib = !path.relative(LIB, file).startsWith('..');

    /**
     * @param {import('estree').Node | null | undefined} sourceNode
     * @param {boolean} dynamic
     */
    function check(sourceNode, dynamic) {
      if (!sourceNode || sourceNode.type !== 'Literal' || typeof sourceNode.value !== 'string') return;
      const spec = sourceNode.value;
      const land = landing(file, spec);
      if (land === null || /\.css$/.test(land.inner)) return; // a style sheet is no module with names to export
      const data = { spec, folder: land.folder, inner: stripExtension(land.inner), door: doorSpec(file, land.folder) };
      if (inLib && land.folder === from) {
        if (land.viaLib) context.report({ node: sourceNode, messageId: 'ownDoor', data });
        return;
      }
      if (arrows !== undefined && from !== null && !(arrows[from] ?? []).includes(land.folder)) {
        const fromPath = from === 'routes' || from === 'cli' || from === 'server' ? from : `lib/${from}`;
        context.report({ node: sourceNode, messageId: 'noArrow', data: { ...data, from, fromPath } });
        return;
      }
      if (land.door) return;
      if (dynamic) {
        if (!onDemand.has(`${land.folder}/${data.inner}`)) context.report({ node: sourceNode, messageId: 'pastDoorDynamic', data });
        return;
      }
      context.report({ node: sourceNode, messageId: 'pastDoor', data });
    }

    return {
      ImportDeclaration: (node) => check(node.source, false),
      ExportNamedDeclaration: (node) => check(node.source, false),
      ExportAllDeclaration: (node) => check(node.source, false),
      ImportExpression: (node) => check(node.source, true),
    };
  },
};

export const kinnotePlugin = { rules: { doors: doorsRule } };
