// `npm run bench -- backup-stream`: a whole-store backup of a large invented caseload in Chromium,
// the present path (bundle built in memory, one string) and the streamed one (streamBackup, pages,
// incremental SHA-256, Blob parts) in the same page, with the page's peak JS heap sampled from
// outside (DevTools protocol, every 100 ms) during each. Goal: under 30 s for 5,000 patients,
// 30,000 assessments, 150,000 observations. STREAM_BENCH_PATIENTS sets the size (default 1,000:
// filling 5,000 through the repositories takes minutes here). Needs a build and Chromium.
import { existsSync } from 'node:fs';
import { chromium } from 'playwright-core';
import { startStaticServer } from '../../src/cli/commands/serve';
import { bundleForPage } from '../e2e/bundle-for-page';

type Run = { seconds: number; bytes: number };

export async function run(print: (line: string) => void): Promise<void> {
  const chromePath = [process.env.CHROME_PATH, '/usr/bin/chromium'].find((p) => p && existsSync(p));
  if (!chromePath || !existsSync('build/index.html')) {
    print('skipped: needs Chromium and a production build (npm run build)');
    return;
  }
  const patients = Number(process.env.STREAM_BENCH_PATIENTS ?? 1000);
  const bundle = await bundleForPage('test/e2e/in-page/backup-stream-checks.ts', 'kinnoteBackupStreamChecks');
  const server = await startStaticServer('build', 0);
  const browser = await chromium.launch({ executablePath: chromePath, args: ['--disable-gpu', '--disable-quic', '--disable-background-networking', '--enable-precise-memory-info'] });
  try {
    const page = await (await browser.newContext({ serviceWorkers: 'block' })).newPage();
    await page.goto(`${server.url}/bench`);
    await page.evaluate(`${bundle}\n;undefined`);
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    const heap = async () => ((await cdp.send('Performance.getMetrics')).metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? 0) / 1e6;
    const peakDuring = async (what: string): Promise<{ run: Run; peakMb: number; baseMb: number }> => {
      await cdp.send('HeapProfiler.collectGarbage');
      const baseMb = await heap();
      let peakMb = baseMb;
      let done = false;
      const sampler = (async () => {
        while (!done) {
          peakMb = Math.max(peakMb, await heap());
          await new Promise((r) => setTimeout(r, 100));
        }
      })();
      const result = (await page.evaluate(`${what}()`)) as Run;
      done = true;
      await sampler;
      return { run: result, peakMb, baseMb };
    };
    // WebAssembly compiles only where the page's policy allows it ('wasm-unsafe-eval'): measured in its own page with the policy bypassed.
    const hashPage = await (await browser.newContext({ serviceWorkers: 'block', bypassCSP: true })).newPage();
    await hashPage.goto(`${server.url}/bench`);
    await hashPage.evaluate(`${bundle}\n;undefined`);
    const speeds = (await hashPage.evaluate('hashSpeeds(40)')) as Record<string, number>;
    await hashPage.close();
    const best = (name: string) => Math.max(...Object.entries(speeds).filter(([k]) => k.startsWith(`${name}#`)).map(([, v]) => v));
    print(
      `Chromium SHA-256 over 40 MB of backup-like text in pieces, best of 3 (MB/s): @noble/hashes ${best('noble').toFixed(1)} · hash-wasm, strings ${best('wasm-string').toFixed(1)} (${(best('wasm-string') / best('noble')).toFixed(2)}× noble) · hash-wasm, bytes ${best('wasm-bytes').toFixed(1)} · Web Crypto one-shot (not incremental, reference) ${best('webcrypto-one-shot').toFixed(1)}`,
    );
    if (process.env.STREAM_BENCH_HASH_ONLY) return;
    const fill = (await page.evaluate(`fillLargeCaseload(${patients})`)) as { records: number; seconds: number };
    print(`Chromium ${browser.version()}: invented caseload of ${patients.toLocaleString('en')} patients (×6 assessments, ×30 observations; ${fill.records.toLocaleString('en')} stored values with audits and summaries) written in ${fill.seconds.toFixed(1)} s`);
    const parts = (await page.evaluate('streamedBackupParts()')) as Record<string, number>;
    print(
      `Chromium streamed backup's steps alone (s): read pages ${parts.read!.toFixed(1)} · redact and bundle form ${parts.redact!.toFixed(1)} · canonical serialisation ${parts.serialise!.toFixed(1)} · encode and hash (@noble/hashes) ${parts.hashNoble!.toFixed(1)} · ${(parts.bytes! / 1e6).toFixed(1)} MB · all observation blocks in one read: Dexie ${parts.dexieAll!.toFixed(1)}, raw getAll ${parts.rawAll!.toFixed(1)} · reads by table: ${Object.entries(parts).filter(([k, v]) => k.startsWith('read:') && v >= 0.05).map(([k, v]) => `${k.slice(5)} ${v.toFixed(1)}`).join(', ')}`,
    );
    if (process.env.STREAM_BENCH_PARTS_ONLY) return;
    const whole = await peakDuring('wholeBackup');
    const streamed = await peakDuring('streamedBackup');
    const scale = 5000 / patients;
    for (const [label, r] of [['present path (whole bundle in memory)', whole], ['streamed (pages, incremental SHA-256, Blob parts)', streamed]] as const) {
      print(
        `Chromium backup, ${label}: ${(r.run.bytes / 1e6).toFixed(1)} MB in ${r.run.seconds.toFixed(2)} s (≈ ${(r.run.seconds * scale).toFixed(1)} s at 5,000 patients, linear) · goal < 30 s: ${(30 / (r.run.seconds * scale)).toFixed(2)}× of goal · peak JS heap ${r.peakMb.toFixed(0)} MB (${(r.peakMb - r.baseMb).toFixed(0)} MB above the start)`,
      );
    }
    print(`streamed vs present: ${(whole.run.seconds / streamed.run.seconds).toFixed(2)}× the speed · heap growth ${((whole.peakMb - whole.baseMb) / Math.max(1, streamed.peakMb - streamed.baseMb)).toFixed(1)}× smaller · same size: ${whole.run.bytes === streamed.run.bytes ? 'yes' : 'NO'}`);
  } finally {
    await browser.close();
    await server.close();
  }
}
