// Bulk insert rate on Chromium's real IndexedDB: 100,000 observations, validated, stamped and
// audited, in batches of 5,000 (the same repository path as the app), and earlier paths in the same
// page for the ratios: main's path before store5 (same layout, slower record preparation), schema 14
// (one stored value per observation), schema 2 (its indexes, a full audit snapshot per record). Needs a build (npm run build)
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
    type Rate = { total: number; stored: number; seconds: number; perSecond: number };
    type Previous = (n: number, batch: number, schema: 2 | 14) => Promise<Rate>;
    const previous = (await page.evaluate((n) => (globalThis as unknown as { bulkInsertPrevious: Previous }).bulkInsertPrevious(n, 5000, 2), 20_000)) as Rate;
    print(`Chromium ${browser.version()} IndexedDB bulk insert, early path (v2 indexes, one audit snapshot per record): ${previous.stored.toLocaleString('en')} observations in ${previous.seconds.toFixed(2)} s = ${Math.round(previous.perSecond).toLocaleString('en')} observations/s`);
    // The layout before schema 16 (one stored value per observation, batch audit entries): the ratio's base.
    const unpacked = (await page.evaluate((n) => (globalThis as unknown as { bulkInsertPrevious: Previous }).bulkInsertPrevious(n, 5000, 14), 20_000)) as Rate;
    print(`Chromium IndexedDB bulk insert, previous layout (schema 14: one stored value per observation, one batch audit entry per 5,000): ${unpacked.stored.toLocaleString('en')} observations in ${unpacked.seconds.toFixed(2)} s = ${Math.round(unpacked.perSecond).toLocaleString('en')} observations/s`);
    let ceilingOnePerRow = Number.NaN;
    for (const perRow of [1, 50, 200]) {
      const ceiling = (await page.evaluate(([n, k]) => (globalThis as unknown as { rawPutCeiling: (n: number, k: number) => Promise<{ perSecond: number }> }).rawPutCeiling(n, k), [20_000, perRow] as const)) as { perSecond: number };
      if (perRow === 1) ceilingOnePerRow = ceiling.perSecond;
      print(`Chromium plain IndexedDB ceiling (no index, no validation, no audit), ${perRow} observation${perRow === 1 ? '' : 's'} per stored value: ${Math.round(ceiling.perSecond).toLocaleString('en')} observations/s · ${(ceiling.perSecond / unpacked.perSecond).toFixed(2)}× previous layout`);
    }
    // STORE_BENCH_OBSERVATIONS: one smaller size on a loaded machine (printed with each figure).
    const sizes = process.env.STORE_BENCH_OBSERVATIONS ? [Number(process.env.STORE_BENCH_OBSERVATIONS)] : [20_000, 100_000];
    // main's path before store5 (records prepared per id with the schema's validation and the
    // generic canonical JSON) and the current one, alternately at each size: the ratio of one run.
    for (const total of sizes) {
      const main = (await page.evaluate((n) => (globalThis as unknown as { bulkInsertMainPath: (n: number) => Promise<unknown> }).bulkInsertMainPath(n), total)) as Rate;
      print(`Chromium IndexedDB bulk insert, main's path before store5 (8179a2f: schema validation, an id at a time, generic canonical JSON): ${main.stored.toLocaleString('en')} observations in ${main.seconds.toFixed(2)} s = ${Math.round(main.perSecond).toLocaleString('en')} observations/s`);
      const r = (await page.evaluate(
        (n) => (globalThis as unknown as { storeChecks: { bulkInsert: (n: number) => Promise<unknown> } }).storeChecks.bulkInsert(n),
        total,
      )) as Rate;
      print(
        `Chromium IndexedDB bulk insert (repository, validated, stamped, one batch audit entry per 5,000): ${r.stored.toLocaleString('en')} observations in ${r.seconds.toFixed(2)} s = ${Math.round(r.perSecond).toLocaleString('en')} observations/s` +
          ` · goal ≥ 25,000 (stretch 50,000): ${(r.perSecond / 25_000).toFixed(2)}× of goal · ${(r.perSecond / main.perSecond).toFixed(2)}× main's path · ${(r.perSecond / unpacked.perSecond).toFixed(2)}× previous layout · ${(r.perSecond / previous.perSecond).toFixed(2)}× early path`,
      );
    }
    // Where the rest goes: the same records prepared (validated, stamped, batch audit entry) and not written.
    const prepared = (await page.evaluate(
      (n) => (globalThis as unknown as { storeChecks: { prepareOnly: (n: number) => Promise<unknown> } }).storeChecks.prepareOnly(n),
      20_000,
    )) as Rate;
    print(`Chromium bulk path without the write (validate, stamp, batch audit entry; nothing stored): ${Math.round(prepared.perSecond).toLocaleString('en')} observations/s, the most the bulk insert could reach with a free write · goal ≥ 25,000: ${(prepared.perSecond / 25_000).toFixed(2)}× of goal`);
    // Backup import (parse, verify, merge, one transaction) of a file written by the app's export.
    // Previous path (a75ca3f) in this page on 2026-12-03, load 13-19: 20,000 observations in 16.3-18.1 s.
    for (const total of sizes) {
      const r = (await page.evaluate((n) => (globalThis as unknown as { importBench: (n: number) => Promise<unknown> }).importBench(n), total)) as {
        stored: number;
        importSeconds: number;
        bytes: number;
      };
      const scaled = (r.importSeconds * 100_000) / total;
      print(
        `Chromium backup import into an empty store: ${r.stored.toLocaleString('en')} observations (${(r.bytes / 1e6).toFixed(1)} MB) in ${r.importSeconds.toFixed(2)} s = ${scaled.toFixed(1)} s per 100,000` +
          ` · goal < 10 s per 100,000: ${(10 / scaled).toFixed(2)}× of goal · plain IndexedDB at one stored value per observation allows at best ${(100_000 / ceilingOnePerRow).toFixed(1)} s`,
      );
    }
  } finally {
    await browser.close();
    await server.close();
  }
}
