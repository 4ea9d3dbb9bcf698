import { describe, expect, it } from 'vitest';
import { TABLE_NAMES, validateRecord, type Observation } from '../../../src/lib/domain';
import { generateDemoScenario } from '../../../src/lib/demo';
import { DEMO_FICTION_NOTICE } from '../../../src/lib/demo/demo-people';
import { SeededRandom } from '../../../src/lib/demo/seeded-random';
import { serializeBundle } from '../../../src/lib/store';
import { demoBundle } from '../../../src/lib/store/demo-caseload';

const DAY_MS = 86_400_000;

describe('SeededRandom', () => {
  it('repeats for a seed, differs between seeds, stays in range', () => {
    const a = new SeededRandom(42);
    const b = new SeededRandom(42);
    const c = new SeededRandom(43);
    const xs = Array.from({ length: 1000 }, () => a.next());
    expect(Array.from({ length: 1000 }, () => b.next())).toEqual(xs);
    expect(Array.from({ length: 1000 }, () => c.next())).not.toEqual(xs);
    expect(xs.every((x) => x >= 0 && x < 1)).toBe(true);
    // Mean of 1000 uniforms: 0.5 ± 4 SE (SE = 1/√12000 ≈ 0.009).
    expect(Math.abs(xs.reduce((s, x) => s + x, 0) / 1000 - 0.5)).toBeLessThan(0.04);
    const r = new SeededRandom(7);
    const normals = Array.from({ length: 4000 }, () => r.normal(10, 2));
    const mean = normals.reduce((s, x) => s + x, 0) / normals.length;
    const sd = Math.sqrt(normals.reduce((s, x) => s + (x - mean) ** 2, 0) / (normals.length - 1));
    expect(Math.abs(mean - 10)).toBeLessThan(0.15);
    expect(Math.abs(sd - 2) / 2).toBeLessThan(0.06);
    expect(() => new SeededRandom(Number.NaN)).toThrow(RangeError);
  });
});

describe('generateDemoScenario', () => {
  const scenario = generateDemoScenario({ seed: 1 });
  const t = scenario.tables;

  it('is deterministic: same seed → byte-identical bundle; another seed → different', async () => {
    const one = serializeBundle(await demoBundle({ seed: 1 }));
    expect(serializeBundle(await demoBundle({ seed: 1 }))).toBe(one);
    expect(serializeBundle(await demoBundle({ seed: 2 }))).not.toBe(one);
  });

  it('every record is valid against its schema and the measure catalogue', () => {
    for (const table of TABLE_NAMES) {
      for (const record of t[table]) {
        const result = validateRecord(table, record);
        expect(result.ok ? [] : result.issues, `${table} ${record.id}`).toEqual([]);
      }
    }
  });

  it('has the shape asked for: a small invented team, about 12 patients, invented identities', () => {
    expect(t.clinicians.length).toBeGreaterThanOrEqual(2);
    expect(t.clinicians.length).toBeLessThanOrEqual(3);
    expect(t.patients).toHaveLength(12);
    expect(new Set(t.patients.map((p) => p.code)).size).toBe(12);
    expect(t.identities.every((i) => i.contact === DEMO_FICTION_NOTICE)).toBe(true);
    expect(t.homeProgrammes.length).toBeGreaterThanOrEqual(2);
    expect(t.adherenceEntries.length).toBeGreaterThan(0);
    expect(t.selfReports.length).toBeGreaterThan(0);
    expect(t.traces.length).toBeGreaterThan(0);
    expect(t.observations.some((o) => o.deleted)).toBe(true);
    for (const kind of ['botulinum-toxin-injection', 'serial-casting', 'oral-medication-change']) expect(t.events.some((e) => e.kind === kind), kind).toBe(true);
    for (const code of ['mas', 'tardieu', 'rom', 'pendulum-ri', 'pendulum-swing-count', 'penn-spasm-frequency', 'spasm-severity']) expect(t.observations.some((o) => o.measureCode === code), code).toBe(true);
  });

  it('assesses every 3–6 weeks over 6–12 months', () => {
    for (const patient of t.patients) {
      const times = t.assessments.filter((a) => a.patientId === patient.id).map((a) => Date.parse(a.performedAt)).sort((a, b) => a - b);
      // Follow-up from the first assessment to the end of the scenario: 6–12 months.
      const spanDays = (Date.parse(scenario.endAt) - times[0]!) / DAY_MS;
      expect(spanDays).toBeGreaterThan(168);
      expect(spanDays).toBeLessThan(366);
      for (let i = 1; i < times.length; i++) {
        const gap = (times[i]! - times[i - 1]!) / DAY_MS;
        expect(gap).toBeGreaterThan(20);
        expect(gap).toBeLessThan(44);
      }
    }
  });

  it('keeps pendulum relaxation indices within about 0.8–1.75', () => {
    const ri = t.observations.filter((o) => o.measureCode === 'pendulum-ri').map((o) => (o.value.kind === 'index' ? o.value.value : Number.NaN));
    expect(ri.length).toBeGreaterThan(10);
    expect(Math.min(...ri)).toBeGreaterThanOrEqual(0.8);
    expect(Math.max(...ri)).toBeLessThanOrEqual(1.75);
  });

  it('shows the toxin response: MAS lower 3–8 weeks after injection than just before, on average', () => {
    // Over several seeds, so the check is about the model and not one noisy draw.
    let before = 0;
    let after = 0;
    let n = 0;
    for (const seed of [1, 2, 3, 4]) {
      const s = generateDemoScenario({ seed }).tables;
      for (const e of s.events.filter((x) => x.kind === 'botulinum-toxin-injection')) {
        const injectedMs = Date.parse(`${e.occurredOn}T12:00:00.000Z`);
        const mas = s.observations.filter((o): o is Observation => o.patientId === e.patientId && o.measureCode === 'mas' && !o.deleted && o.value.kind === 'ordinal');
        const rank = (o: Observation) => (o.value.kind === 'ordinal' ? o.value.rank : Number.NaN);
        const pre = mas.filter((o) => { const d = (injectedMs - Date.parse(o.takenAt)) / DAY_MS; return d > 0 && d < 45; });
        const post = mas.filter((o) => { const d = (Date.parse(o.takenAt) - injectedMs) / DAY_MS; return d >= 21 && d <= 56; });
        if (pre.length === 0 || post.length === 0) continue;
        before += pre.reduce((sum, o) => sum + rank(o), 0) / pre.length;
        after += post.reduce((sum, o) => sum + rank(o), 0) / post.length;
        n++;
      }
    }
    expect(n).toBeGreaterThan(3);
    expect(after / n).toBeLessThan(before / n - 0.3);
  });

  it('refuses bad options', () => {
    expect(() => generateDemoScenario({ seed: 1, endDate: '30/06/2025' })).toThrow(RangeError);
    expect(() => generateDemoScenario({ seed: 1, patientCount: 0 })).toThrow(RangeError);
  });
});
