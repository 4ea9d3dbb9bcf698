import { describe, expect, it } from 'vitest';
import { validateRecord } from '../../../src/lib/domain';
import { aPatient, anAssessment, anEvent, anObservation } from '../../support/records';

// The record builders must give whole records: the domain's own strict schemas (which refuse a missing
// or an extra field) accept each default once its ids are real UUIDv7 values (RFC 9562 layout).
const uuid = (n: number) => `0190a0b0-0000-7000-8000-${String(n).padStart(12, '0')}`;
const ids = { deviceId: uuid(1), clinicianId: uuid(2), patientId: uuid(3) };

describe('test record builders', () => {
  it('give records the domain schemas accept', () => {
    const results = [
      validateRecord('patients', aPatient({ deviceId: ids.deviceId, clinicianId: ids.clinicianId, id: ids.patientId })),
      validateRecord('assessments', anAssessment({ ...ids, id: uuid(4), assessorId: ids.clinicianId })),
      validateRecord('observations', anObservation({ ...ids, id: uuid(5), assessmentId: uuid(4) })),
      validateRecord('events', anEvent({ ...ids, id: uuid(6) })),
    ];
    expect(results.map((r) => (r.ok ? 'ok' : JSON.stringify(r.issues)))).toEqual(['ok', 'ok', 'ok', 'ok']);
  });

  it('freeze what they give, so code that mutates a shared input throws', () => {
    const o = anObservation();
    expect(Object.isFrozen(o) && Object.isFrozen(o.value)).toBe(true);
    expect(() => {
      (o as { siteCode: string }).siteCode = 'knee';
    }).toThrow(TypeError);
  });
});
