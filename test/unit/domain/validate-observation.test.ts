import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import { MEASURE_CATALOGUE, validateObservation, validateRecord } from '../../../src/lib/domain';
import { pick, plausibleObservation } from '../../support/generated-observations';
import { mulberry32 } from '../../support/seeded-random';

// The hand-written observation check (bulk path) against its reference: the schema, i.e. the
// validation library (valibot) with the catalogue rules, through validateRecord. Records are
// generated from the catalogue and then damaged at random (seeded), so that both verdicts occur
// many times over; every case must give the same verdict, the same issues (field and message, in
// order) and, when valid, an equal record with the same key order.

/** Values a damaged field may take: wrong types, near misses of each format, odd objects. */
const ODD_VALUES: readonly unknown[] = [
  null, undefined, '', 'x', 0, -0, 1.5, -3, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, true, false, {}, [], new Date(0),
  'left', 'none', 'up', 'active', 'inclinometer', 'ordinal', 'mas', 'knee', 10n,
  '2025-02-30T10:00:00.000Z', '2025-03-01T10:00:00Z', '2025-03-01T24:00:00.000Z', '2025-03-01',
  '0190A0B0-0000-7000-8000-000000000001', '0190a0b0-0000-4000-8000-000000000001', '0190a0b0-0000-7000-c000-000000000001',
  Object.create(null) as object, Symbol('s'), () => 1,
];
const VALUE_KEYS = ['kind', 'grade', 'rank', 'r1Deg', 'r2Deg', 'quality', 'spasticityAngleDeg', 'angleDeg', 'value'];

function damage(rand: () => number, record: Record<string, unknown>): unknown {
  const keys = Object.keys(record);
  const value = record.value as Record<string, unknown>;
  switch (Math.floor(rand() * 13)) {
    case 0:
      delete record[pick(rand, keys)];
      return record;
    case 1:
      record[pick(rand, keys)] = pick(rand, ODD_VALUES);
      return record;
    case 2:
      record[pick(rand, ['colour', 'notes', 'valueKind', 'toString', 'constructor'])] = 'x';
      return record;
    case 3:
      delete value[pick(rand, Object.keys(value))];
      return record;
    case 4:
      value[pick(rand, VALUE_KEYS)] = pick(rand, ODD_VALUES);
      return record;
    case 5:
      value[pick(rand, ['extra', 'unit', 'grade', 'value'])] = 1;
      return record;
    case 6:
      record.value = pick(rand, [null, 5, 'angle', [], [1], { kind: 'nope' }, {}, { kind: 'angle' }, { value: 3 }, Object.create({ kind: 'angle', angleDeg: 10 })]);
      return record;
    case 7: {
      // Another measure's code, site, side, mode or instrument.
      const other = pick(rand, MEASURE_CATALOGUE);
      const field = pick(rand, ['measureCode', 'siteCode', 'side', 'mode', 'instrument']);
      record[field] = field === 'measureCode' ? other.code : field === 'siteCode' ? pick(rand, other.sites).code : field === 'side' ? pick(rand, ['left', 'right', 'none']) : pick(rand, [null, 'active', 'passive', 'phone-sensor', 'universal-goniometer']);
      return record;
    }
    case 8:
      // Inherited fields: present to `in`, listed by for…in.
      return Object.assign(Object.create(pick(rand, [{ inherited: 1 }, { id: record.id }, {}])) as object, record);
    case 9:
      return pick(rand, [null, undefined, 5, 'observation', [], [record], new Date(0)]);
    case 10:
      // An own "__proto__" key, as JSON.parse makes it.
      return JSON.parse(JSON.stringify(record, (_k, v: unknown) => (typeof v === 'bigint' ? 1 : v)).replace('{', '{"__proto__":{"id":1},')) as unknown;
    case 11: {
      // One of the value's own numbers made a near miss: fraction, negative zero, NaN, infinite, text.
      const own = Object.keys(value).filter((k) => k !== 'kind' && k !== 'grade');
      if (own.length > 0) value[pick(rand, own)] = pick(rand, [1.5, -0.5, -0, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, '3', null, 2 ** 53]);
      return record;
    }
    default:
      record.createdAt = '2099-01-01T00:00:00.000Z';
      return record;
  }
}

describe('validateObservation (bulk path) against the schema', () => {
  it('gives the same verdict, issues and record as validateRecord on 10,000 generated records', () => {
    const rand = mulberry32(20261203);
    let accepted = 0;
    let refused = 0;
    const paths = new Set<string>();
    for (let n = 0; n < 10_000; n++) {
      let candidate: unknown = plausibleObservation(rand);
      const damages = n % 3 === 0 ? 0 : 1 + Math.floor(rand() * 3);
      for (let d = 0; d < damages; d++) candidate = isPlainRecord(candidate) ? damage(rand, candidate) : candidate;
      const reference = validateRecord('observations', candidate);
      const fast = validateObservation(candidate);
      const sameOrder = !reference.ok || (fast.ok && JSON.stringify(fast.record) === JSON.stringify(reference.record));
      if (!isDeepStrictEqual(fast, reference) || !sameOrder) expect({ case: n, ...fast }, show(candidate)).toEqual({ case: n, ...reference });
      if (fast.ok && fast.record.value === (candidate as { value: unknown }).value) expect.fail(`case ${n}: the record shares the caller's value object`);
      if (!reference.ok) for (const issue of reference.issues) paths.add(issue.path);
      if (reference.ok) accepted++;
      else refused++;
    }
    // Both verdicts occur often, and the refusals name every field and catalogue rule.
    expect(accepted).toBeGreaterThan(1_500);
    expect(refused).toBeGreaterThan(5_000);
    expect([...paths].sort()).toEqual(
      expect.arrayContaining(['', '__proto__', 'assessmentId', 'clinicianId', 'colour', 'createdAt', 'deleted', 'deviceId', 'id', 'inherited', 'instrument', 'measureCode', 'mode', 'patientId', 'side', 'siteCode', 'takenAt', 'traceId', 'updatedAt', 'value', 'value.angleDeg', 'value.extra', 'value.grade', 'value.kind', 'value.quality', 'value.r1Deg', 'value.r2Deg', 'value.rank', 'value.spasticityAngleDeg', 'value.value']),
    );
  });

  it('returns a record that does not share the caller’s value object', () => {
    const rand = mulberry32(7);
    let record: Record<string, unknown> | null = null;
    for (let i = 0; i < 100 && record === null; i++) {
      const candidate = plausibleObservation(rand);
      if (validateRecord('observations', candidate).ok) record = candidate;
    }
    const result = validateObservation(record);
    expect(result.ok).toBe(true);
    if (result.ok) {
      (record!.value as Record<string, unknown>).kind = 'changed';
      expect(result.record.value.kind).not.toBe('changed');
    }
  });
});

function isPlainRecord(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype && typeof (value as { value?: unknown }).value === 'object' && (value as { value: unknown }).value !== null;
}

function show(value: unknown): string {
  try {
    return JSON.stringify(value, (_k, v: unknown) => (typeof v === 'bigint' ? `${v}n` : typeof v === 'number' && !Number.isFinite(v) ? String(v) : v));
  } catch {
    return String(value);
  }
}
