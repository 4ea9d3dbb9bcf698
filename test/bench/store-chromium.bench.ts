// Bulk insert rate on Chromium's real IndexedDB: 100,000 observations, validated, stamped and
// audited, in batches of 5,000 (the same repository path as the app), and earlier paths in the same
// page for the ratios: main's path before the faster record preparation (same layout), schema 14
// (one stored value per observation), schema 2 (its indexes, a full audit snapshot per record); then
// the backup import, main's path and the present one. Needs a build (npm run build)
// and Chromium (/usr/bin/chromium or CHROME_PATH); prints what is missing otherwise.
import { existsSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { startStaticServer } from '../../src/cli/commands/serve';
import { bundleForPage } from '../e2e/bundle-for-page';
import { IMPORT_BENCH_BASE, mainSourceTree } from './main-path';

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
    // STORE_BENCH_IMPORT_ONLY=1: the import figures alone (a loaded machine).
    const importOnly = process.env.STORE_BENCH_IMPORT_ONLY === '1';
    let ceilingOnePerRow = Number.NaN;
    const sizes = process.env.STORE_BENCH_OBSERVATIONS ? [Number(process.env.STORE_BENCH_OBSERVATIONS)] : [20_000, 100_000];
    if (!importOnly) {
      type Previous = (n: number, batch: number, schema: 2 | 14) => Promise<Rate>;
      const previous = (await page.evaluate((n) => (globalThis as unknown as { bulkInsertPrevious: Previous }).bulkInsertPrevious(n, 5000, 2), 20_000)) as Rate;
      print(`Chromium ${browser.version()} IndexedDB bulk insert, early path (v2 indexes, one audit snapshot per record): ${previous.stored.toLocaleString('en')} observations in ${previous.seconds.toFixed(2)} s = ${Math.round(previous.perSecond).toLocaleString('en')} observations/s`);
      // The layout before schema 16 (one stored value per observation, batch audit entries): the ratio's base.
      const unpacked = (await page.evaluate((n) => (globalThis as unknown as { bulkInsertPrevious: Previous }).bulkInsertPrevious(n, 5000, 14), 20_000)) as Rate;
      print(`Chromium IndexedDB bulk insert, previous layout (schema 14: one stored value per observation, one batch audit entry per 5,000): ${unpacked.stored.toLocaleString('en')} observations in ${unpacked.seconds.toFixed(2)} s = ${Math.round(unpacked.perSecond).toLocaleString('en')} observations/s`);
      for (const perRow of [1, 50, 200]) {
        const ceiling = (await page.evaluate(([n, k]) => (globalThis as unknown as { rawPutCeiling: (n: number, k: number) => Promise<{ perSecond: number }> }).rawPutCeiling(n, k), [20_000, perRow] as const)) as { perSecond: number };
        if (perRow === 1) ceilingOnePerRow = ceiling.perSecond;
        print(`Chromium plain IndexedDB ceiling (no index, no validation, no audit), ${perRow} observation${perRow === 1 ? '' : 's'} per stored value: ${Math.round(ceiling.perSecond).toLocaleString('en')} observations/s · ${(ceiling.perSecond / unpacked.perSecond).toFixed(2)}× previous layout`);
      }
      // main's path before the faster record preparation (records prepared per id with the schema's
      // validation and the generic canonical JSON) and the current one, alternately at each size.
      for (const total of sizes) {
        const main = (await page.evaluate((n) => (globalThis as unknown as { bulkInsertMainPath: (n: number) => Promise<unknown> }).bulkInsertMainPath(n), total)) as Rate;
        print(`Chromium IndexedDB bulk insert, main's path before the faster preparation (8179a2f: schema validation, an id at a time, generic canonical JSON): ${main.stored.toLocaleString('en')} observations in ${main.seconds.toFixed(2)} s = ${Math.round(main.perSecond).toLocaleString('en')} observations/s`);
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
    }
    // Backup import of a file written by the app's export, into an empty store: main's path (commit
    // IMPORT_BENCH_BASE, extracted from git) and the present one alternately, on the same file in this page.
    const main = mainSourceTree();
    if (main) {
      const entry = join(main.dir, 'page-entry.ts');
      writeFileSync(entry, "import { importBackup, openStore } from './src/lib/store';\nexport const path = { importBackup, openStore };\n(globalThis as unknown as { kinnoteMainImport: unknown }).kinnoteMainImport = path;\n");
      await page.evaluate(`${await bundleForPage(entry, 'kinnoteMainImportBundle')}\n;undefined`);
    } else print(`main's import path (${IMPORT_BENCH_BASE}) not run: no git history here`);
    const rounds = Number(process.env.IMPORT_BENCH_ROUNDS ?? 1);
    for (const total of sizes) {
      const file = (await page.evaluate((n) => (globalThis as unknown as { importBenchFile: (n: number) => Promise<unknown> }).importBenchFile(n), total)) as { bytes: number };
      type Imported = { stored: number; importSeconds: number };
      const times: Record<'present' | 'main', number[]> = { present: [], main: [] };
      // The page's main-thread busy time (DevTools Performance.getMetrics TaskDuration) during each
      // import call: on a loaded machine it moves far less than the wall time. IndexedDB's own work
      // in the browser process is not in it; opening and deleting the store are.
      const busy: Record<'present' | 'main', number[]> = { present: [], main: [] };
      const cdp = await context.newCDPSession(page);
      await cdp.send('Performance.enable');
      const taskSeconds = async () => (await cdp.send('Performance.getMetrics')).metrics.find((m) => m.name === 'TaskDuration')?.value ?? Number.NaN;
      let stored = 0;
      for (let round = 0; round < rounds; round++) {
        // Alternate which path goes first, so neither always meets a warmer or fuller page.
        const order = main ? (round % 2 === 0 ? (['main', 'present'] as const) : (['present', 'main'] as const)) : (['present'] as const);
        for (const which of order) {
          const before = await taskSeconds();
          const r = (await page.evaluate((w) => (globalThis as unknown as { importBench: (w: string) => Promise<unknown> }).importBench(w), which)) as Imported;
          busy[which].push((await taskSeconds()) - before);
          times[which].push(r.importSeconds);
          if (which === 'present') stored = r.stored;
        }
      }
      const median = (xs: number[]) => {
        const sorted = [...xs].sort((a, b) => a - b);
        const mid = Math.floor(sorted.length / 2);
        return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
      };
      const present = median(times.present);
      const scaled = (present * 100_000) / total;
      const list = (xs: number[]) => xs.map((x) => x.toFixed(2)).join(', ');
      print(
        `Chromium backup import into an empty store: ${stored.toLocaleString('en')} observations (${(file.bytes / 1e6).toFixed(1)} MB) in ${list(times.present)} s (median ${present.toFixed(2)} s) = ${scaled.toFixed(1)} s per 100,000` +
          ` · goal < 10 s per 100,000: ${(10 / scaled).toFixed(2)}× of goal · main's path (${main?.commit ?? 'not run'}) ${list(times.main)} s: ${(median(times.main) / present).toFixed(2)}× main's path in this run` +
          ` · main-thread busy ${list(busy.present)} s vs main's path ${list(busy.main)} s` +
          (importOnly ? '' : ` · plain IndexedDB at one stored value per observation allows at best ${(100_000 / ceilingOnePerRow).toFixed(1)} s`),
      );
    }
    print(`  (load average ${loadavg().map((l) => l.toFixed(1)).join(', ')} at the end)`);
  } finally {
    await browser.close();
    await server.close();
  }
}
