// Observations generated from the measure catalogue with a seeded generator, for checks that compare
// two implementations on many records (validateObservation against the schema, the observation
// digest text against canonicalJson). Plausible, not all valid: values stray out of range, grades
// and ranks disagree, R1 passes R2, so the catalogue rules are exercised too.
import { MEASURE_CATALOGUE, type Measure } from '../../src/lib/domain';

const hex = (rand: () => number, n: number) => Array.from({ length: n }, () => Math.floor(rand() * 16).toString(16)).join('');
const uuid7 = (rand: () => number) => `${hex(rand, 8)}-${hex(rand, 4)}-7${hex(rand, 3)}-${'89ab'[Math.floor(rand() * 4)]}${hex(rand, 3)}-${hex(rand, 12)}`;
export const pick = <T,>(rand: () => number, list: readonly T[]): T => list[Math.floor(rand() * list.length)] as T;
const iso = (rand: () => number) => new Date(Date.UTC(2024, 0, 1) + Math.floor(rand() * 3e10)).toISOString();

/** A plausible value for `measure` (often valid, sometimes out of range: the catalogue check is compared too). */
function valueFor(rand: () => number, measure: Measure): Record<string, unknown> {
  const angle = () => Math.round((rand() * 200 - 40) * (rand() < 0.5 ? 1 : 10)) / (rand() < 0.5 ? 1 : 10);
  switch (measure.kind) {
    case 'ordinal': {
      const grade = pick(rand, measure.grades);
      return { kind: 'ordinal', grade: grade.label, rank: rand() < 0.9 ? grade.rank : grade.rank + 1 };
    }
    case 'tardieu': {
      const r1 = angle();
      const r2 = rand() < 0.85 ? r1 + Math.abs(angle()) : r1 - 5;
      return { kind: 'tardieu', r1Deg: r1, r2Deg: r2, quality: Math.floor(rand() * 7), spasticityAngleDeg: rand() < 0.9 ? r2 - r1 : r2 - r1 + 1 };
    }
    case 'angle':
      return { kind: 'angle', angleDeg: angle() };
    default: {
      const whole = measure.integer || measure.kind === 'count' || measure.kind === 'rating';
      const x = whole ? Math.floor(rand() * (measure.limits.max + 2)) : rand() * (measure.limits.max + 0.5);
      return { kind: measure.kind, value: rand() < 0.95 ? x : x + 0.5 };
    }
  }
}

/** One observation-shaped record: usually valid, sometimes not (see the file header). */
export function plausibleObservation(rand: () => number): Record<string, unknown> {
  const measure = pick(rand, MEASURE_CATALOGUE);
  const created = iso(rand);
  const romLike = measure.kind !== 'ordinal' && measure.kind !== 'tardieu';
  return {
    id: uuid7(rand),
    createdAt: created,
    updatedAt: rand() < 0.9 ? created : iso(rand),
    deviceId: uuid7(rand),
    clinicianId: uuid7(rand),
    deleted: rand() < 0.1,
    patientId: uuid7(rand),
    assessmentId: uuid7(rand),
    takenAt: iso(rand),
    measureCode: measure.code,
    siteCode: pick(rand, measure.sites).code,
    side: measure.lateral ? pick(rand, ['left', 'right']) : 'none',
    mode: romLike && measure.modes !== null ? pick(rand, measure.modes) : null,
    instrument: romLike && measure.instruments !== null ? pick(rand, measure.instruments) : null,
    value: valueFor(rand, measure),
    traceId: rand() < 0.3 ? uuid7(rand) : null,
  };
}
