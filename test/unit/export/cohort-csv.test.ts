import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { generateDemoScenario } from '../../../src/lib/demo';
import type { Identity, Observation } from '../../../src/lib/domain';
import { buildCohortIndex, CohortExportCancelled, prepareCohortExport, runCohortExport, type CohortExportProgress, type CohortFilters } from '../../../src/lib/export';
import { collectText } from '../../../src/lib/export/text-chunk';
import { longCsvHeader } from '../../../src/lib/export/long-csv';
import { SUMMARY_CSV_HEADER } from '../../../src/lib/export/summary-csv';
import { wideCsvHeader } from '../../../src/lib/export/wide-csv';
import { RecordsBuilder, mas, patient, TEST_KEY } from './cohort-fixture';

const demo = generateDemoScenario({ seed: 5 }).tables;
const index = buildCohortIndex(demo);
const anchored: CohortFilters = { anchor: { kind: 'botulinum-toxin-injection', windowStartDay: 28, windowEndDay: 120 } };

/** Parses with papaparse (RFC 4180 reader, dev dependency) and fails on any parse error. */
function parse(text: string): string[][] {
  const result = Papa.parse<string[]>(text, { header: false, skipEmptyLines: false });
  expect(result.errors).toEqual([]);
  const rows = result.data;
  // The file ends with CRLF, which papaparse reads as one empty trailing row.
  expect(rows[rows.length - 1]).toEqual(['']);
  return rows.slice(0, -1);
}

/** What a cell should read back as: numbers in JavaScript's shortest round-trip form, null empty. */
const cell = (v: string | number | null | undefined) => (v === null || v === undefined ? '' : typeof v === 'number' ? (Number.isFinite(v) ? String(v) : '') : v);

describe('CSV files parse back with papaparse to the same values', () => {
  it('long: one row per exported observation, values equal to the records', async () => {
    const prepared = await prepareCohortExport(index, { filters: anchored, disclosure: { kind: 'deidentified', keyBytes: TEST_KEY, dates: { kind: 'days-from-baseline' } } });
    const rows = parse(collectText(prepared.files.find((f) => f.kind === 'long')!.chunks()));
    expect(rows[0]).toEqual(longCsvHeader(prepared.plan));
    expect(rows.length - 1).toBe(prepared.cohort.observationCount);
    const header = rows[0]!;
    const col = (name: string) => header.indexOf(name);
    // Rebuild the expected rows from the records, in cohort order.
    const expected: string[][] = [];
    for (const pair of prepared.cohort.pairs) {
      const s = pair.series;
      const view = prepared.plan.patients.get(s.patient.id)!;
      for (let i = pair.baselineIndex; i <= pair.lastIndex; i++) {
        const o = s.observations[i] as Observation;
        const day = Math.floor(Date.parse(o.takenAt) / 86_400_000) - view.zeroDay;
        const v = o.value;
        expected.push([
          view.label,
          cell(day),
          o.measureCode,
          o.siteCode,
          o.side,
          cell(o.mode),
          cell(v.kind === 'angle' ? v.angleDeg : v.kind === 'index' || v.kind === 'count' || v.kind === 'rating' ? v.value : null),
          cell(v.kind === 'ordinal' ? v.grade : null),
          cell(v.kind === 'tardieu' ? v.r1Deg : null),
          cell(v.kind === 'tardieu' ? v.spasticityAngleDeg : null),
        ]);
      }
    }
    const got = rows.slice(1).map((r) => ['patient', 'day_from_baseline', 'measure', 'site', 'side', 'mode', 'value', 'grade', 'r1_deg', 'spasticity_angle_deg'].map((n) => r[col(n)]!));
    expect(got).toEqual(expected);
    expect(got.length).toBeGreaterThan(20);
  });

  it('wide and summary: headers, row counts and every number read back exactly', async () => {
    const prepared = await prepareCohortExport(index, { filters: anchored, disclosure: { kind: 'deidentified', keyBytes: TEST_KEY, dates: { kind: 'days-from-baseline' } } });
    const wide = parse(collectText(prepared.files.find((f) => f.kind === 'wide')!.chunks()));
    expect(wide[0]).toEqual(wideCsvHeader(prepared.plan));
    expect(wide.length - 1).toBe(prepared.files.find((f) => f.kind === 'wide')!.rows);
    const h = wide[0]!;
    for (const r of wide.slice(1)) {
      const change = Number(r[h.indexOf('change')]);
      expect(change).toBe(Number(r[h.indexOf('follow_up_value')]) - Number(r[h.indexOf('baseline_value')]));
    }
    const summary = parse(collectText(prepared.files.find((f) => f.kind === 'summary')!.chunks()));
    expect(summary[0]).toEqual([...SUMMARY_CSV_HEADER]);
    expect(summary.length - 1).toBe(prepared.summary.groups.length);
    const sh = summary[0]!;
    prepared.summary.groups.forEach((g, i) => {
      const r = summary[i + 1]!;
      expect(r[sh.indexOf('median_change')]).toBe(cell(g.summary.medianChange));
      expect(r[sh.indexOf('wilcoxon_p')]).toBe(cell(g.summary.wilcoxon.p));
      expect(r[sh.indexOf('srm')]).toBe(cell(g.summary.standardisedResponseMean));
      expect(r[sh.indexOf('mdc_note')]).toBe(cell(g.mdcNote));
      if (r[sh.indexOf('srm')] !== '') expect(Number(r[sh.indexOf('srm')])).toBe(g.summary.standardisedResponseMean);
    });
  });

  it('formula-like text is neutralised (identified export with hostile names) and still parses back', async () => {
    const b = new RecordsBuilder();
    b.patients.push(patient('p1'), patient('p2'));
    b.clinicians[0] = { ...b.clinicians[0]!, displayName: '@SUM(A1:A9)' };
    for (const id of ['p1', 'p2']) {
      b.assess(id, '2025-01-05', [{ measure: 'mas', site: 'elbow-flexors', side: 'left', value: mas('2') }]);
      b.assess(id, '2025-02-05', [{ measure: 'mas', site: 'elbow-flexors', side: 'left', value: mas('1') }]);
    }
    const stamp = { createdAt: '2025-01-01T00:00:00.000Z', updatedAt: '2025-01-01T00:00:00.000Z', deviceId: 'd', clinicianId: 'c1', deleted: false };
    const identities: Identity[] = [
      { ...stamp, id: 'i1', patientId: 'p1', familyName: '=HYPERLINK("http://x.invalid","click")', givenName: '+1-2', dateOfBirth: null, contact: null },
      { ...stamp, id: 'i2', patientId: 'p2', familyName: '-cmd|calc', givenName: '\tTab, "quoted"', dateOfBirth: '1960-05-01', contact: null },
    ];
    const prepared = await prepareCohortExport(b.records(), { filters: {}, disclosure: { kind: 'identified', identities } });
    const rows = parse(collectText(prepared.files.find((f) => f.kind === 'long')!.chunks()));
    const h = rows[0]!;
    const families = rows.slice(1).map((r) => r[h.indexOf('family_name')]);
    expect(families).toContain(`'=HYPERLINK("http://x.invalid","click")`);
    expect(families).toContain(`'-cmd|calc`);
    const givens = rows.slice(1).map((r) => r[h.indexOf('given_name')]);
    expect(givens).toContain(`'+1-2`);
    expect(givens).toContain(`'\tTab, "quoted"`);
    expect(rows.slice(1).map((r) => r[h.indexOf('assessor')])).toContain(`'@SUM(A1:A9)`);
    // No cell of any CSV starts with a formula character.
    for (const file of prepared.files.filter((f) => f.kind !== 'fhir')) {
      for (const r of parse(collectText(file.chunks()))) for (const c of r) expect(/^[=+\-@\t\r]/.test(c) && !/^-?\d/.test(c)).toBe(false);
    }
  });
});

describe('streaming', () => {
  it('chunks stay near the requested size and join to the same text', async () => {
    const prepared = await prepareCohortExport(index, { filters: {}, chunkChars: 1024, disclosure: { kind: 'deidentified', keyBytes: TEST_KEY, dates: { kind: 'days-from-baseline' } } });
    const whole = await prepareCohortExport(index, { filters: {}, disclosure: { kind: 'deidentified', keyBytes: TEST_KEY, dates: { kind: 'days-from-baseline' } } });
    for (const [i, file] of prepared.files.entries()) {
      const chunks = [...file.chunks()];
      if (file.kind !== 'summary') expect(chunks.length).toBeGreaterThan(3);
      // A chunk closes at the first row that takes it past the size: at most one row (or resource) over.
      if (file.kind !== 'summary') for (const c of chunks) expect(c.text.length).toBeLessThan(1024 + 4096);
      expect(chunks.reduce((n, c) => n + c.rows, 0)).toBe(file.rows);
      expect(chunks.map((c) => c.text).join('')).toBe(collectText(whole.files[i]!.chunks()));
    }
  });

  it('runCohortExport reports monotone progress up to the total and stops on cancel', async () => {
    const prepared = await prepareCohortExport(index, { filters: {}, chunkChars: 2048, disclosure: { kind: 'deidentified', keyBytes: TEST_KEY, dates: { kind: 'days-from-baseline' } } });
    const seen: CohortExportProgress[] = [];
    const texts = new Map<string, string>();
    await runCohortExport(prepared, { onChunk: (f, t) => void texts.set(f.kind, (texts.get(f.kind) ?? '') + t), onProgress: (p) => seen.push(p) });
    for (let i = 1; i < seen.length; i++) expect(seen[i]!.rowsDone).toBeGreaterThanOrEqual(seen[i - 1]!.rowsDone);
    const last = seen[seen.length - 1]!;
    expect(last.rowsDone).toBe(last.rowsTotal);
    expect(texts.get('long')).toBe(collectText(prepared.files[0]!.chunks()));

    let chunks = 0;
    await expect(runCohortExport(prepared, { onChunk: () => void chunks++, isCancelled: () => chunks >= 3 })).rejects.toBeInstanceOf(CohortExportCancelled);
    expect(chunks).toBe(3);
  });
});
