import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { patientCode, validateRecord } from '../../../src/lib/domain';

describe('patientCode', () => {
  it('always gives XXXX-XXXX from the unambiguous alphabet (property)', () => {
    fc.assert(
      fc.property(fc.integer(), (seed) => {
        let state = seed >>> 0;
        const code = patientCode((n) =>
          Uint8Array.from({ length: n }, () => {
            state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
            return state >>> 24;
          }),
        );
        expect(code).toMatch(/^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/);
      }),
    );
  });

  it('skips bytes at or above 240 so that every letter is equally likely', () => {
    const bytes = [255, 240, 0, 1, 2, 3, 4, 5, 6, 7, 8, 9];
    let k = 0;
    const code = patientCode((n) => Uint8Array.from({ length: n }, () => bytes[k++ % bytes.length]!));
    expect(code).toBe('2345-6789');
  });

  it('is accepted by the Patient schema', () => {
    const base = {
      id: '0190a0b0-0000-7000-8000-000000000001',
      createdAt: '2025-01-01T00:00:00.000Z',
      updatedAt: '2025-01-01T00:00:00.000Z',
      deviceId: '0190a0b0-0000-7000-8000-000000000002',
      clinicianId: '0190a0b0-0000-7000-8000-000000000003',
      deleted: false,
    };
    const patient = { ...base, code: '2345-6789', birthYear: 1960, condition: 'stroke', affectedSides: ['left'], status: 'active' };
    expect(validateRecord('patients', patient).ok).toBe(true);
    const bad = validateRecord('patients', { ...patient, code: 'AB12-0000', affectedSides: ['left', 'left'] });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues.map((i) => i.path).sort()).toEqual(['affectedSides', 'code']);
  });
});
