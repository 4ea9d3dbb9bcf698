// Bundles a test entry (TypeScript importing src/lib) into one script that a page can run, so store
// code can be checked on Chromium's real IndexedDB and Web Crypto. Output goes to test-output/.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { build } from 'vite';

export async function bundleForPage(entry: string, name: string): Promise<string> {
  const outDir = join('test-output', 'page-bundles');
  await build({
    configFile: false,
    logLevel: 'warn',
    build: {
      lib: { entry, name, formats: ['iife'], fileName: () => `${name}.js` },
      outDir,
      emptyOutDir: false,
      minify: false,
      sourcemap: false,
    },
  });
  return readFileSync(join(outDir, `${name}.js`), 'utf8');
}
