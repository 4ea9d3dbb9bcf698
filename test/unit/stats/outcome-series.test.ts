import { describe, expect, it } from 'vitest';
import type { Observation, ObservationValue } from '../../../src/lib/domain';
import { latestVerdicts, mdcSourceLine, outcomeSeries } from '../../../src/lib/stats';
import { ORDINAL_STEP_MDC } from '../../../src/lib/stats/choose-mdc';
import { anObservation, masGrade } from '../../support/records';

let counter = 0;
function obs(
  measureCode: string,
  siteCode: string,
  side: Observation['side'],
  takenAt: string,
  value: ObservationValue,
  extra: Partial<Observation> = {},
): Observation {
  counter++;
  const id = `0190a000-0000-7000-8000-${String(counter).padStart(12, '0')}`;
  return anObservation({ id, createdAt: takenAt, updatedAt: takenAt, clinicianId: 'c1', assessmentId: `a-${takenAt}`, takenAt, measureCode, siteCode, side, value, ...extra });
}
const mas = masGrade;

describe('outcomeSeries', () => {
  it('Modified Ashworth 3 → 1+ is two grade steps better, judged by the one-step convention (common practice)', () => {
    const series = outcomeSeries(
      [
        obs('mas', 'knee-extensors', 'left', '2026-01-10T10:00:00.000Z', mas('3', 4)),
        obs('mas', 'knee-extensors', 'left', '2026-02-10T10:00:00.000Z', mas('2', 3)),
        obs('mas', 'knee-extensors', 'left', '2026-03-10T10:00:00.000Z', mas('1+', 2)),
      ],
      { baselineRule: { kind: 'first' } },
    );
    expect(series).toHaveLength(1);
    const s = series[0]!;
    expect(s.title).toBe('Left knee extensors (quadriceps) · Modified Ashworth Scale');
    expect(s.ordinalLabels).toEqual(['0', '1', '1+', '2', '3', '4']);
    expect(s.verdict?.verdict).toBe('improved');
    expect(s.verdict?.change).toBe(-2);
    expect(s.verdict?.text).toContain('from grade 3 to grade 1+');
    expect(s.mdc).toBe(ORDINAL_STEP_MDC);
    // Grades fall steadily: Theil–Sen slope is −1 step per ~30 days, and the trend is ordinal-safe.
    expect(s.trend?.method).toBe('theil-sen');
    expect(s.trend?.slopePer30Days).toBeCloseTo((-1 * 30) / 30.5, 1);
  });

  it('separates sides and ROM modes, leaves out tombstones, and never gives a verdict on one point', () => {
    const series = outcomeSeries(
      [
        obs('rom', 'elbow-flexion', 'left', '2026-01-01T09:00:00.000Z', { kind: 'angle', angleDeg: 100 }, { mode: 'passive', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'left', '2026-01-01T09:00:00.000Z', { kind: 'angle', angleDeg: 90 }, { mode: 'active', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'right', '2026-01-01T09:00:00.000Z', { kind: 'angle', angleDeg: 140 }, { mode: 'passive', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'left', '2026-02-01T09:00:00.000Z', { kind: 'angle', angleDeg: 104 }, { mode: 'passive', instrument: 'universal-goniometer', deleted: true }),
      ],
      { baselineRule: { kind: 'first' } },
    );
    expect(series.map((s) => s.key).sort()).toEqual(['rom|elbow-flexion|left|active', 'rom|elbow-flexion|left|passive', 'rom|elbow-flexion|right|passive']);
    for (const s of series) expect(s.verdict).toBeNull();
  });

  it('elbow flexion with one goniometer and one rater uses the published 6° (Armstrong et al. 1998, same tester)', () => {
    const series = outcomeSeries(
      [
        obs('rom', 'elbow-flexion', 'left', '2026-01-01T09:00:00.000Z', { kind: 'angle', angleDeg: 100 }, { mode: 'passive', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'left', '2026-02-01T09:00:00.000Z', { kind: 'angle', angleDeg: 105 }, { mode: 'passive', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'left', '2026-03-01T09:00:00.000Z', { kind: 'angle', angleDeg: 107 }, { mode: 'passive', instrument: 'universal-goniometer' }),
      ],
      { baselineRule: { kind: 'first' } },
    );
    const s = series[0]!;
    expect(s.mdc?.value).toBe(6);
    expect(s.mdc?.citation).toContain('Armstrong');
    expect(s.verdict?.verdict).toBe('improved'); // +7° ≥ 6°
    // Two raters: the between-tester figure (10°) applies and +7° is within error.
    const twoRaters = outcomeSeries(
      [
        obs('rom', 'elbow-flexion', 'left', '2026-01-01T09:00:00.000Z', { kind: 'angle', angleDeg: 100 }, { mode: 'passive', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'left', '2026-03-01T09:00:00.000Z', { kind: 'angle', angleDeg: 107 }, { mode: 'passive', instrument: 'universal-goniometer', clinicianId: 'c2' }),
      ],
      { baselineRule: { kind: 'first' } },
    )[0]!;
    expect(twoRaters.mdc?.value).toBe(10);
    expect(twoRaters.verdict?.verdict).toBe('no-change');
  });

  it('a local MDC adopted by the clinic wins over the reference, and the verdict says so', () => {
    const series = outcomeSeries(
      [
        obs('rom', 'elbow-flexion', 'left', '2026-01-01T09:00:00.000Z', { kind: 'angle', angleDeg: 100 }, { mode: 'passive', instrument: 'universal-goniometer' }),
        obs('rom', 'elbow-flexion', 'left', '2026-03-01T09:00:00.000Z', { kind: 'angle', angleDeg: 104 }, { mode: 'passive', instrument: 'universal-goniometer' }),
      ],
      { baselineRule: { kind: 'first' }, localMdc: [{ measureCode: 'rom', siteCode: 'elbow-flexion', value: 3.5, citation: 'team study 2026' }] },
    )[0]!;
    expect(series.verdict?.verdict).toBe('improved');
    expect(series.mdc).toEqual({ value: 3.5, source: 'local', citation: 'team study 2026' });
    expect(series.verdict?.text).toBe('Improved from 100° to 104° (+4°), beyond measurement error (MDC 3.5°).');
  });

  it('Tardieu series chart the spasticity angle R2 − R1, where lower is better; no MDC means "establish locally"', () => {
    const t = (r1: number, r2: number, q: number): ObservationValue => ({ kind: 'tardieu', r1Deg: r1, r2Deg: r2, quality: q, spasticityAngleDeg: r2 - r1 });
    const s = outcomeSeries(
      [
        obs('tardieu', 'ankle-soleus', 'right', '2026-01-01T09:00:00.000Z', t(60, 100, 2)),
        obs('tardieu', 'ankle-soleus', 'right', '2026-02-01T09:00:00.000Z', t(80, 100, 1)),
      ],
      { baselineRule: { kind: 'first' } },
    )[0]!;
    expect(s.points.map((p) => p.value)).toEqual([40, 20]);
    expect(s.betterWhen).toBe('lower');
    expect(s.verdict?.verdict).toBe('no-mdc');
    expect(s.mdcNote).toContain('establish locally');
    // latestVerdicts (the caseload's and the visit review's path) passes the same reason on.
    const latest = latestVerdicts(
      [
        obs('tardieu', 'ankle-soleus', 'right', '2026-01-01T09:00:00.000Z', t(60, 100, 2)),
        obs('tardieu', 'ankle-soleus', 'right', '2026-02-01T09:00:00.000Z', t(80, 100, 1)),
      ],
      { baselineRule: { kind: 'first' } },
    )[0]!;
    expect(latest.mdcNote).toBe(s.mdcNote);
    // Shown with what the catalogue found instead (Ben-Shabat et al. 2013), not a bare "none".
    expect(mdcSourceLine(null, '°', false, latest.mdcNote)).toMatch(/^MDC: none published for this measure; your team can establish one with a reliability study\. No MDC in degrees .*Ben-Shabat/);
    expect(mdcSourceLine(null, '°', false, 'none: establish locally with a reliability study')).toBe('MDC: none published for this measure; your team can establish one with a reliability study');
    expect(mdcSourceLine(null, '°', false, null)).toBe('MDC: none known');
  });

  it('baseline "last before event" picks the assessment before an injection', () => {
    const series = outcomeSeries(
      [
        obs('mas', 'ankle-plantarflexors', 'right', '2026-01-01T09:00:00.000Z', mas('2', 3)),
        obs('mas', 'ankle-plantarflexors', 'right', '2026-02-01T09:00:00.000Z', mas('3', 4)),
        obs('mas', 'ankle-plantarflexors', 'right', '2026-03-15T09:00:00.000Z', mas('1', 1)),
      ],
      { baselineRule: { kind: 'lastBeforeEvent', eventMs: Date.parse('2026-02-10T00:00:00Z') } },
    )[0]!;
    expect(s(series.baseline)).toEqual([4, 4]);
    expect(series.verdict?.change).toBe(-3);
  });
});

function s(b: { low: number; high: number } | null): [number, number] | null {
  return b ? [b.low, b.high] : null;
}
