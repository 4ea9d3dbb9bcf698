import { describe, expect, it } from 'vitest';
import { MEASURE_CATALOGUE, findMeasure, findSite, referenceMdc95 } from '../../../src/lib/domain';
import { HYPERMOBILITY_MARGIN_DEG, ROM_SITES } from '../../../src/lib/domain/rom-motions';
import { SEM_TO_MDC95 } from '../../../src/lib/domain/reference-mdc';

const STATUS = /^(VERIFIED|RECOMPUTED|MEMORY|DERIVED|COMMON PRACTICE)/;

describe('measure catalogue', () => {
  it('has one entry per code, each complete', () => {
    const codes = MEASURE_CATALOGUE.map((m) => m.code);
    expect(new Set(codes).size).toBe(codes.length);
    for (const m of MEASURE_CATALOGUE) {
      expect(m.label.length, m.code).toBeGreaterThan(0);
      expect(m.unit.length, m.code).toBeGreaterThan(0);
      expect(m.sites.length, m.code).toBeGreaterThan(0);
      expect(['lower', 'higher', 'none'], m.code).toContain(m.improvement);
      expect(m.definitionSource.length, m.code).toBeGreaterThan(10);
      const refs = [m.reference, ...m.sites.map((s) => s.reference).filter((r) => r !== undefined)];
      for (const ref of refs) {
        if (ref.kind === 'none') expect(ref.reason, m.code).toMatch(/^none/);
        else for (const f of ref.figures) {
          expect(f.status, `${m.code} ${f.source}`).toMatch(STATUS);
          expect(f.low).toBeLessThanOrEqual(f.high);
          expect(f.source.length).toBeGreaterThan(10);
        }
      }
    }
  });

  it('holds the measures the issue asks for, with their kinds and UCUM units', () => {
    const expected: [string, string, string, string][] = [
      ['mas', 'ordinal', '{grade}', 'lower'],
      ['tardieu', 'tardieu', 'deg', 'lower'],
      ['pendulum-ri', 'index', '1', 'higher'],
      ['pendulum-ri-normalised', 'index', '1', 'higher'],
      ['pendulum-first-swing', 'angle', 'deg', 'higher'],
      ['pendulum-resting-angle', 'angle', 'deg', 'none'],
      ['pendulum-swing-count', 'count', '{swings}', 'higher'],
      ['rom', 'angle', 'deg', 'higher'],
      ['penn-spasm-frequency', 'rating', '{score}', 'lower'],
      ['spasm-severity', 'rating', '{score}', 'lower'],
    ];
    for (const [code, kind, unit, improvement] of expected) {
      const m = findMeasure(code);
      expect(m, code).toBeDefined();
      expect([m!.kind, m!.unit, m!.improvement]).toEqual([kind, unit, improvement]);
    }
  });

  it('grades the Modified Ashworth Scale 0, 1, 1+, 2, 3, 4 with ranks 0..5 (REFERENCES.md §9a)', () => {
    const mas = findMeasure('mas');
    if (mas?.kind !== 'ordinal') throw new Error('mas must be ordinal');
    expect(mas.grades.map((g) => [g.label, g.rank])).toEqual([['0', 0], ['1', 1], ['1+', 2], ['2', 3], ['3', 4], ['4', 5]]);
    expect(mas.caution).toMatch(/mean of ranks/);
  });

  it('grades Tardieu quality 0..5 (REFERENCES.md §9b)', () => {
    const t = findMeasure('tardieu');
    if (t?.kind !== 'tardieu') throw new Error('tardieu');
    expect(t.qualityGrades.map((g) => g.rank)).toEqual([0, 1, 2, 3, 4, 5]);
    expect(t.componentImprovement).toEqual({ r1Deg: 'higher', r2Deg: 'higher', quality: 'lower', spasticityAngleDeg: 'lower' });
  });

  it('covers hip, knee, ankle, shoulder, elbow, wrist and finger motions', () => {
    for (const joint of ['hip', 'knee', 'ankle', 'shoulder', 'elbow', 'wrist', 'finger']) {
      expect(ROM_SITES.some((s) => s.code.startsWith(`${joint}-`)), joint).toBe(true);
    }
  });
});

describe('ROM limits: widest published normal + margin', () => {
  // Widest of the three sets in REFERENCES.md §10a (AAOS MEMORY; Merck and VA tables VERIFIED copies).
  const fixtures = [
    { input: 'hip-flexion', expectedWidest: 125, source: 'REFERENCES.md §10a: AAOS 120, Merck 125, VA 125' },
    { input: 'knee-flexion', expectedWidest: 140, source: 'REFERENCES.md §10a: AAOS 135, Merck 130, VA 140' },
    { input: 'ankle-plantarflexion', expectedWidest: 50, source: 'REFERENCES.md §10a: AAOS 50, Merck 50, VA 45' },
    { input: 'ankle-dorsiflexion', expectedWidest: 20, source: 'REFERENCES.md §10a: 20 in all three' },
    { input: 'elbow-flexion', expectedWidest: 160, source: 'REFERENCES.md §10a: AAOS 150, Merck 160, VA 145' },
    { input: 'wrist-ulnar-deviation', expectedWidest: 65, source: 'REFERENCES.md §10a: AAOS 30, Merck 65, VA 45' },
    { input: 'shoulder-flexion', expectedWidest: 180, source: 'REFERENCES.md §10a: AAOS 180, VA 180' },
    { input: 'hip-adduction', expectedWidest: 45, source: 'REFERENCES.md §10a: AAOS 30, Merck 45, VA 25' },
  ];
  for (const f of fixtures) {
    it(`${f.input}: max = ${f.expectedWidest} + margin (${f.source})`, () => {
      const site = findSite(findMeasure('rom')!, f.input)!;
      expect(site.limits!.max).toBe(f.expectedWidest + HYPERMOBILITY_MARGIN_DEG);
      expect(site.limits!.basis).toContain(`widest normal ${f.expectedWidest}°`);
    });
  }

  it('lets a contracture read below neutral down to the opposite motion limit', () => {
    const rom = findMeasure('rom')!;
    expect(findSite(rom, 'ankle-dorsiflexion')!.limits!.min).toBe(-(50 + HYPERMOBILITY_MARGIN_DEG));
    expect(findSite(rom, 'knee-extension')!.limits!.min).toBe(-(140 + HYPERMOBILITY_MARGIN_DEG));
    expect(findSite(rom, 'knee-extension')!.limits!.max).toBe(HYPERMOBILITY_MARGIN_DEG);
    expect(findSite(rom, 'finger-pip-flexion')!.limits!.min).toBe(-HYPERMOBILITY_MARGIN_DEG);
  });
});

describe('referenceMdc95', () => {
  const fixtures = [
    { input: ['rom', 'elbow-flexion', 'universal-goniometer', 'same-rater'], expected: 6, source: 'Armstrong et al. 1998 (REFERENCES.md §10b, VERIFIED abstract)' },
    { input: ['rom', 'elbow-flexion', 'universal-goniometer', 'different-raters'], expected: 10, source: 'Armstrong et al. 1998' },
    { input: ['rom', 'elbow-extension', 'universal-goniometer', 'same-rater'], expected: 7, source: 'Armstrong et al. 1998' },
    { input: ['rom', 'forearm-supination', 'universal-goniometer', 'different-raters'], expected: 11, source: 'Armstrong et al. 1998' },
    { input: ['rom', 'knee-flexion', 'inclinometer', 'same-rater'], expected: 6, source: 'Hancock et al. 2018 (VERIFIED abstract)' },
    { input: ['rom', 'knee-flexion', 'phone-sensor', 'different-raters'], expected: 12, source: 'Hancock et al. 2018' },
    { input: ['rom', 'shoulder-flexion', 'universal-goniometer', 'different-raters'], expected: 25 * 1.96 * Math.SQRT2, source: 'Hayes et al. 2001 SEM 25° × 1.96√2 (Weir 2005)' },
  ] as const;
  for (const f of fixtures) {
    it(`${f.input.join(' ')} → ${f.expected.toFixed(2)} (${f.source})`, () => {
      const found = referenceMdc95(f.input[0], f.input[1], { instrument: f.input[2], raters: f.input[3] });
      expect(found).not.toBeNull();
      expect(Math.abs(found!.mdc95 - f.expected) / f.expected).toBeLessThan(1e-12);
    });
  }

  it('1.96·√2 ≈ 2.772 (REFERENCES.md §6a)', () => {
    expect(SEM_TO_MDC95).toBeCloseTo(2.772, 3);
  });

  it('gives null where nothing is published: establish locally', () => {
    expect(referenceMdc95('mas', 'elbow-flexors', { instrument: null, raters: 'same-rater' })).toBeNull();
    expect(referenceMdc95('tardieu', 'ankle-soleus', { instrument: null, raters: 'same-rater' })).toBeNull();
    expect(referenceMdc95('rom', 'hip-flexion', { instrument: 'universal-goniometer', raters: 'same-rater' })).toBeNull();
    expect(referenceMdc95('nope', 'x', { instrument: null, raters: 'same-rater' })).toBeNull();
  });

  it('does not use a figure for another instrument', () => {
    expect(referenceMdc95('rom', 'elbow-flexion', { instrument: 'phone-sensor', raters: 'same-rater' })).toBeNull();
  });

  it("lays out in the visit form only measures whose shape fits their kind, the pendulum indices not at all", () => {
    // The form's shapes (DEVELOPERS.md, measure catalogue): grade = an ordinal per site and side;
    // tardieu = the Tardieu value per site and side; angle = one angle per site and side;
    // rating = one whole number of a whole-person measure.
    const fits: Record<string, (m: (typeof MEASURE_CATALOGUE)[number]) => boolean> = {
      grade: (m) => m.kind === 'ordinal' && m.lateral,
      tardieu: (m) => m.kind === 'tardieu' && m.lateral,
      angle: (m) => m.kind === 'angle' && m.lateral,
      rating: (m) => m.kind === 'rating' && !m.lateral && m.integer && m.sites.length === 1,
    };
    for (const m of MEASURE_CATALOGUE) if (m.form) expect(fits[m.form.shape]?.(m), `${m.code} as ${m.form.shape}`).toBe(true);
    expect(MEASURE_CATALOGUE.filter((m) => m.form).map((m) => `${m.code}:${m.form?.shape}`)).toEqual([
      'mas:grade',
      'tardieu:tardieu',
      'rom:angle',
      'penn-spasm-frequency:rating',
      'spasm-severity:rating',
    ]);
  });
});
