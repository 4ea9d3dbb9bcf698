// Bulk insert rate on Chromium's real IndexedDB: 100,000 observations, validated, stamped and
// audited, in batches of 5,000 (the same repository path as the app). Needs a build (npm run build)
// and Chromium (/usr/bin/chromium or CHROME_PATH); prints what is missing otherwise.
import { existsSync } from 'node:fs';
import { chromium } from 'playwright-core';
import { startStaticServer } from '../../src/cli/commands/serve';
import { bundleForPage } from '../e2e/bundle-for-page';

export async function run(print: (line: string) => void): Promise<void> {
  const chromePath = [process.env.CHROME_PATH, '/usr/bin/chromium'].find((p) => p && existsSync(p));
  if (!chromePath || !existsSync('build/index.html')) {
    print('skipped: needs Chromium and a production build (npm run build)');
    return;
  }
  const bundle = await bundleForPage('test/e2e/in-page/store-checks.ts', 'kinnoteStoreChecks');
  const server = await startStaticServer('build', 0);
  const browser = await chromium.launch({ executablePath: chromePath, args: ['--disable-gpu', '--disable-quic', '--disable-background-networking'] });
  try {
    const context = await browser.newContext({ serviceWorkers: 'block' });
    const page = await context.newPage();
    await page.goto(`${server.url}/bench`);
    // Through the DevTools protocol: the page's Content-Security-Policy refuses inline <script> tags.
    await page.evaluate(`${bundle}\n;undefined`);
    for (const total of [10_000, 100_000]) {
      const r = (await page.evaluate(
        (n) => (globalThis as unknown as { storeChecks: { bulkInsert: (n: number) => Promise<unknown> } }).storeChecks.bulkInsert(n),
        total,
      )) as { total: number; stored: number; seconds: number; perSecond: number };
      print(`Chromium ${browser.version()} IndexedDB bulk insert: ${r.stored.toLocaleString('en')} observations (+ as many audit entries) in ${r.seconds.toFixed(2)} s = ${Math.round(r.perSecond).toLocaleString('en')} observations/s`);
    }
  } finally {
    await browser.close();
    await server.close();
  }
}
