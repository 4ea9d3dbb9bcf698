// ESLint flat config (kept as a dotfile; run with `eslint -c .eslint.config.js`).
import js from '@eslint/js';
import ts from 'typescript-eslint';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import svelteConfig from './svelte.config.js';
import { kinnotePlugin } from './eslint/doors-rule.js';
import { diagramLayers } from './eslint/layers.js';

const layerArrows = Object.fromEntries([...diagramLayers().arrows].map(([part, targets]) => [part, [...targets]]));
const core = ['domain', 'pendulum', 'stats', 'export', 'demo'];
const browserGlobals = [
  'window', 'document', 'navigator', 'localStorage', 'sessionStorage', 'indexedDB', 'location',
  'fetch', 'alert', 'confirm',
].map((name) => ({
  name,
  message: 'The computational core takes what it needs as arguments (pass `now`, `rng`, data); see DEVELOPERS.md.',
}));

export default ts.config(
  { ignores: ['build/', '.svelte-kit/', 'node_modules/', 'test-output/', 'coverage/'] },
  js.configs.recommended,
  ...ts.configs.recommended,
  ...svelte.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      // The app is served from the root with no base path, so plain hrefs are already resolved.
      'svelte/no-navigation-without-resolve': 'off',
    },
  },
  {
    // Doors (DEVELOPERS.md): another folder of src/lib is entered only through its index.ts. onDemand: the modules a
    // dynamic import() loads by their own path, so that they stay out of the chunks of the pages that import the door.
    files: ['src/**/*.ts', 'src/**/*.js', 'src/**/*.svelte'],
    plugins: { kinnote: kinnotePlugin },
    rules: {
      'kinnote/doors': [
        'error',
        {
          arrows: layerArrows,
          onDemand: [
            'store/demo-caseload',
            'store/phone-reanalysis-run',
            'export/referral-report-pdf',
            'ui/team/team-sync.svelte',
            'ui/UnlockPanel.svelte',
            'ui/ReanalysisNotice.svelte',
            'ui/SetupDevice.svelte',
            'ui/programme/paint-drawing',
            'workers/backup-stream-client',
          ],
        },
      ],
    },
  },
  {
    files: ['**/*.svelte', '**/*.svelte.ts'],
    languageOptions: { parserOptions: { parser: ts.parser, extraFileExtensions: ['.svelte'], svelteConfig } },
  },
  {
    // The core never touches the page, storage or the clock: it runs unchanged in Node and workers.
    files: [...core.map((d) => `src/lib/${d}/**/*.ts`), 'src/lib/sensors/signal/**/*.ts'],
    rules: {
      'no-restricted-globals': ['error', ...browserGlobals],
      'no-restricted-properties': [
        'error',
        { object: 'Math', property: 'random', message: 'Pass a seeded rng in.' },
        { object: 'Date', property: 'now', message: 'Pass `now` in.' },
      ],
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['svelte', 'svelte/*', '$app/*', 'dexie', 'uplot', '*.svelte'], message: 'The core imports no UI or storage.' },
            { group: ['**/store', '**/store/*', '**/ui/*', '**/charts/*', '**/workers/*'], message: 'The core imports no UI or storage.' },
          ],
        },
      ],
    },
  },
);
