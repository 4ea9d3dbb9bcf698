// Starts the production build on 127.0.0.1 for the browser tests and checks that Chromium exists.
// A missing Chromium or build fails the run with a message that says what to do: nothing skips silently.
import { existsSync } from 'node:fs';
import type { TestProject } from 'vitest/node';
import { startStaticServer } from '../../src/cli/commands/serve';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    chromePath: string;
  }
}

export function findChromium(): string {
  const candidates = [process.env.CHROME_PATH, '/usr/bin/chromium', '/usr/bin/chromium-browser'].filter(
    (p): p is string => Boolean(p),
  );
  const found = candidates.find((p) => existsSync(p));
  if (!found) {
    throw new Error(
      'Browser tests need Chromium and none was found (looked at ' +
        candidates.join(', ') +
        '). On Debian: `apt-get update && apt-get install -y chromium`, or set CHROME_PATH to a Chromium binary.',
    );
  }
  return found;
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const chromePath = findChromium();
  if (!existsSync('build/index.html') || !existsSync('build/sw.js')) {
    throw new Error('Browser tests run against the production build: run `npm run build` first (npm test does).');
  }
  const server = await startStaticServer('build', 0);
  project.provide('baseUrl', server.url);
  project.provide('chromePath', chromePath);
  return () => server.close();
}
