// The page's export client, run where Web Workers do not exist (Node): it falls back to the main
// thread with the same job code the worker runs.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { generateDemoScenario } from '../../../src/lib/demo';
import { buildCohortIndex, countCohort, prepareCohortExport } from '../../../src/lib/export';
import { collectText } from '../../../src/lib/export/text-chunk';
import { CohortExportFailure, startCohortExport } from '../../../src/lib/workers';
import { type CohortExportPrepared } from '../../../src/lib/workers/cohort-export-protocol';
import { TEST_KEY } from './cohort-fixture';

const demo = generateDemoScenario({ seed: 6 }).tables;
const filters = { anchor: { kind: 'botulinum-toxin-injection' as const, windowStartDay: 28, windowEndDay: 120 } };

describe('startCohortExport (main-thread fallback)', () => {
  it('reports prepared counts and progress, and resolves with a Blob per file', async () => {
    expect(typeof Worker).toBe('undefined');
    let prepared: CohortExportPrepared | null = null;
    let progressCalls = 0;
    const job = startCohortExport({ records: demo, filters, disclosure: { kind: 'deidentified', dates: 'days-from-baseline' } }, { onPrepared: (p) => (prepared = p), onProgress: () => progressCalls++ });
    const result = await job.result;
    expect(result.ranOn).toBe('main-thread');
    expect(prepared).not.toBeNull();
    expect(result.count).toEqual(countCohort(buildCohortIndex(demo), filters));
    expect(progressCalls).toBeGreaterThanOrEqual(result.fileResults.length);
    expect(result.fileResults.map((f) => f.fileName)).toEqual(['kinnote-cohort-long.csv', 'kinnote-cohort-wide.csv', 'kinnote-cohort-summary.csv', 'kinnote-cohort-fhir.json']);
    const long = Papa.parse(await result.fileResults[0]!.blob.text(), { header: true, skipEmptyLines: true });
    expect(long.data.length).toBe(result.count.observations);
    // The summary does not depend on the random key: equal to a direct export with a fixed key.
    const direct = await prepareCohortExport(demo, { filters, disclosure: { kind: 'deidentified', keyBytes: TEST_KEY, dates: { kind: 'days-from-baseline' } } });
    expect(await result.fileResults[2]!.blob.text()).toBe(collectText(direct.files[2]!.chunks()));
    // The groups cross to the page without functions (structured-clone safe).
    expect(() => structuredClone(result.groups)).not.toThrow();
    expect(result.fileResults[3]!.blob.type).toBe('application/fhir+json');
  });

  it('two exports draw different keys (pseudonyms differ)', async () => {
    const run = async () => (await startCohortExport({ records: demo, filters: {}, disclosure: { kind: 'deidentified', dates: 'shifted' }, files: ['long'] }).result).fileResults[0]!.blob.text();
    const [a, b] = await Promise.all([run(), run()]);
    const first = (text: string) => text.split('\r\n')[1]!.split(',')[0];
    expect(first(a)).toMatch(/^P-[0-9a-f]{16}$/);
    expect(first(a)).not.toBe(first(b));
  });

  it('cancel() rejects with reason "cancelled"', async () => {
    const job = startCohortExport({ records: demo, filters: {}, disclosure: { kind: 'deidentified', dates: 'days-from-baseline' } });
    job.cancel();
    await expect(job.result).rejects.toMatchObject({ name: 'CohortExportFailure', reason: 'cancelled' });
  });

  it('refused filters reject with reason "refused" and the field', async () => {
    const job = startCohortExport({ records: demo, filters: { measureCode: 'nope' }, disclosure: { kind: 'deidentified', dates: 'days-from-baseline' } });
    const error = await job.result.catch((e: unknown) => e);
    expect(error).toBeInstanceOf(CohortExportFailure);
    expect(error).toMatchObject({ reason: 'refused', field: 'filters.measureCode' });
  });
});
