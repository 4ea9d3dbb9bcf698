import { describe, expect, it } from 'vitest';
import { createHmac } from 'node:crypto';
import Papa from 'papaparse';
import { generateDemoScenario } from '../../../src/lib/demo';
import { SeededRandom } from '../../../src/lib/demo/seeded-random';
import { buildCohortIndex, CohortExportError, prepareCohortExport, type CohortFilters } from '../../../src/lib/export';
import { birthYearBand, type DeidentifiedDates } from '../../../src/lib/export/prepare-disclosure';
import { collectText } from '../../../src/lib/export/text-chunk';
import { type PreparedCohortExport } from '../../../src/lib/export/export-cohort';
import { TEST_KEY } from './cohort-fixture';

const demo = generateDemoScenario({ seed: 11 }).tables;
const index = buildCohortIndex(demo);
const filterSets: CohortFilters[] = [{}, { anchor: { kind: 'botulinum-toxin-injection', windowStartDay: 28, windowEndDay: 120 } }];

async function exportAll(filters: CohortFilters, dates: DeidentifiedDates, key = TEST_KEY): Promise<{ prepared: PreparedCohortExport; texts: Record<string, string> }> {
  const prepared = await prepareCohortExport(index, { filters, disclosure: { kind: 'deidentified', keyBytes: key, dates } });
  const texts: Record<string, string> = {};
  for (const file of prepared.files) texts[file.kind] = collectText(file.chunks());
  return { prepared, texts };
}

/** Every value that could identify a demo patient or reveal free text. */
function identityValues(): { what: string; value: string }[] {
  const values: { what: string; value: string }[] = [];
  const add = (what: string, value: string | null | undefined) => {
    if (value && value.trim().length >= 3) values.push({ what, value });
  };
  for (const i of demo.identities) {
    add('family name', i.familyName);
    add('given name', i.givenName);
    add('date of birth', i.dateOfBirth);
    add('contact', i.contact);
  }
  for (const p of demo.patients) {
    add('patient code', p.code);
    add('patient id', p.id);
  }
  for (const a of demo.assessments) {
    add('assessment notes', a.notes);
    add('assessment id', a.id);
  }
  for (const e of demo.events) {
    add('event notes', e.notes);
    add('event summary', e.summary);
    add('event muscles', e.muscles);
    add('event dose', e.dose);
  }
  for (const o of demo.observations) add('observation id', o.id);
  for (const c of demo.clinicians) {
    add('clinician name', c.displayName);
    add('clinician id', c.id);
    add('clinician registration', c.registration);
  }
  return values;
}

describe('re-identification guard (demo caseload)', () => {
  const values = identityValues();

  it('the demo has identities, notes and free text to look for', () => {
    expect(demo.identities.length).toBeGreaterThan(5);
    expect(values.filter((v) => v.what === 'family name').length).toBe(demo.identities.length);
    expect(values.some((v) => v.what === 'assessment notes')).toBe(true);
    expect(values.some((v) => v.what === 'contact')).toBe(true);
  });

  for (const mode of ['days-from-baseline', 'shifted'] as const) {
    it(`no name, date of birth, contact, free text, code or record id appears in any file (${mode})`, async () => {
      const rng = new SeededRandom(99);
      for (const filters of filterSets) {
        const { prepared, texts } = await exportAll(filters, mode === 'shifted' ? { kind: 'shifted', rng: () => rng.next() } : { kind: mode });
        expect(prepared.cohort.pairs.length).toBeGreaterThan(0);
        for (const [file, text] of Object.entries(texts)) {
          for (const { what, value } of values) {
            if (text.includes(value)) throw new Error(`${file}: the ${what} "${value}" appears in a de-identified export`);
          }
        }
      }
    });
  }

  it('days-from-baseline mode writes no real calendar date of any record', async () => {
    const realDates = new Set<string>();
    for (const o of demo.observations) realDates.add(o.takenAt.slice(0, 10));
    for (const e of demo.events) realDates.add(e.occurredOn);
    for (const filters of filterSets) {
      const { texts } = await exportAll(filters, { kind: 'days-from-baseline' });
      for (const [file, text] of Object.entries(texts)) {
        const dates = text.match(/\d{4}-\d{2}-\d{2}/g) ?? [];
        for (const d of dates) if (realDates.has(d)) throw new Error(`${file}: real date ${d} appears`);
        // FHIR dates are synthetic, counted from 2000-01-01 (the bundle's meta.tag says so).
        if (file === 'fhir') expect(dates.every((d) => d.startsWith('2000') || d.startsWith('2001') || d.startsWith('2002'))).toBe(true);
      }
    }
  });
});

describe('pseudonyms and dates', () => {
  it('patient labels are HMAC-SHA-256(key, "patient:" + id), checked with node:crypto', async () => {
    const { prepared } = await exportAll({}, { kind: 'days-from-baseline' });
    expect(prepared.plan.patients.size).toBeGreaterThan(0);
    for (const [id, view] of prepared.plan.patients) {
      const expected = createHmac('sha256', Buffer.from(TEST_KEY)).update(`patient:${id}`).digest('hex').slice(0, 16);
      expect(view.label).toBe(`P-${expected}`);
    }
  });

  it('a new key gives unrelated labels (exports cannot be linked); the same key the same ones', async () => {
    const other = Uint8Array.from(TEST_KEY, (b) => b ^ 0x5a);
    const a = await exportAll({}, { kind: 'days-from-baseline' });
    const b = await exportAll({}, { kind: 'days-from-baseline' }, other);
    const again = await exportAll({}, { kind: 'days-from-baseline' });
    const labels = (p: PreparedCohortExport) => [...p.plan.patients.values()].map((v) => v.label);
    expect(labels(again.prepared)).toEqual(labels(a.prepared));
    const shared = labels(a.prepared).filter((l) => labels(b.prepared).includes(l));
    expect(shared).toEqual([]);
    expect(again.texts.long).toBe(a.texts.long);
  });

  it('refuses a short key', async () => {
    await expect(prepareCohortExport(index, { filters: {}, disclosure: { kind: 'deidentified', keyBytes: new Uint8Array(16), dates: { kind: 'days-from-baseline' } } })).rejects.toThrow(CohortExportError);
  });

  it('birth years fall in 5-year bands', () => {
    const table: [number, string][] = [[1950, '1950-1954'], [1954, '1950-1954'], [1955, '1955-1959'], [2003, '2000-2004'], [1999, '1995-1999']];
    for (const [year, band] of table) expect(birthYearBand(year)).toBe(band);
  });

  it('no exact birth year leaves a de-identified file: each patient shows the band of their year', async () => {
    const { prepared, texts } = await exportAll({}, { kind: 'days-from-baseline' });
    const rows = Papa.parse<Record<string, string>>(texts.long!, { header: true, skipEmptyLines: true }).data;
    expect(Object.keys(rows[0]!)).not.toContain('birth_year');
    for (const [id, view] of prepared.plan.patients) {
      const year = demo.patients.find((p) => p.id === id)!.birthYear;
      expect(view.birthYears).toBe(birthYearBand(year));
      expect(rows.filter((r) => r.patient === view.label).every((r) => r.birth_years === birthYearBand(year))).toBe(true);
    }
  });

  it('days from baseline: each patient starts at day 0 and keeps the real intervals', async () => {
    const { prepared, texts } = await exportAll({}, { kind: 'days-from-baseline' });
    const rows = Papa.parse<Record<string, string>>(texts.long!, { header: true, skipEmptyLines: true }).data;
    const byPatient = new Map<string, number[]>();
    for (const r of rows) byPatient.set(r.patient!, [...(byPatient.get(r.patient!) ?? []), Number(r.day_from_baseline)]);
    for (const days of byPatient.values()) expect(Math.min(...days)).toBe(0);
    // Intervals: baseline→follow-up in days equals the real interval in the records.
    const wide = Papa.parse<Record<string, string>>(texts.wide!, { header: true, skipEmptyLines: true }).data;
    const pair = prepared.cohort.pairs[0]!;
    const realDays = (pair.series.days[pair.followUpIndex]! - pair.series.days[pair.baselineIndex]!);
    const first = wide[0]!;
    expect(Number(first.follow_up_day_from_baseline) - Number(first.baseline_day_from_baseline)).toBe(realDays);
  });

  it('shifted dates: one non-zero whole-day offset per patient within ±maxShiftDays; intervals kept', async () => {
    const rng = new SeededRandom(42);
    const { prepared, texts } = await exportAll({}, { kind: 'shifted', rng: () => rng.next(), maxShiftDays: 30 });
    for (const view of prepared.plan.patients.values()) {
      expect(Number.isInteger(view.offsetDays)).toBe(true);
      expect(view.offsetDays).not.toBe(0);
      expect(Math.abs(view.offsetDays)).toBeLessThanOrEqual(30);
    }
    const rows = Papa.parse<Record<string, string>>(texts.long!, { header: true, skipEmptyLines: true }).data;
    const pair = prepared.cohort.pairs[0]!;
    const view = prepared.plan.patients.get(pair.series.patient.id)!;
    const real = pair.series.observations[pair.baselineIndex]!.takenAt.slice(0, 10);
    const shifted = rows.find((r) => r.patient === view.label && r.role === 'baseline')!.shifted_date!;
    expect((Date.parse(shifted) - Date.parse(real)) / 86_400_000).toBe(view.offsetDays);
  });

  it('an rng that returns values outside [0, 1) is refused', async () => {
    await expect(exportAll({}, { kind: 'shifted', rng: () => 1 })).rejects.toThrow(/rng/);
  });
});

describe('identified export', () => {
  it('exists only with identities passed, and then names patients', async () => {
    const prepared = await prepareCohortExport(index, { filters: {}, disclosure: { kind: 'identified', identities: demo.identities } });
    const long = collectText(prepared.files[0]!.chunks());
    const someone = demo.identities[0]!;
    expect(long).toContain(someone.familyName);
    const withoutOne = demo.identities.slice(1);
    await expect(prepareCohortExport(index, { filters: {}, disclosure: { kind: 'identified', identities: withoutOne } })).rejects.toThrow(/identity/);
  });
});
