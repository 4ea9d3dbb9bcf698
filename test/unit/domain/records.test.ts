import { describe, expect, it } from 'vitest';
import { TABLE_NAMES, validateRecord } from '../../../src/lib/domain';
import { DomainValidationError } from '../../../src/lib/domain/domain-error';
import { parseRecord } from '../../../src/lib/domain/record-tables';

const base = {
  id: '0190a0b0-0000-7000-8000-000000000001',
  createdAt: '2025-01-01T10:00:00.000Z',
  updatedAt: '2025-01-01T10:00:00.000Z',
  deviceId: '0190a0b0-0000-7000-8000-000000000002',
  clinicianId: '0190a0b0-0000-7000-8000-000000000003',
  deleted: false,
};
const P = '0190a0b0-0000-7000-8000-000000000004';

describe('record schemas', () => {
  it('lists every record kind once', () => {
    expect(new Set(TABLE_NAMES).size).toBe(13);
  });

  it('requires muscles and dose for a botulinum toxin injection, and endsOn after occurredOn', () => {
    const event = { ...base, patientId: P, kind: 'botulinum-toxin-injection', occurredOn: '2025-01-10', endsOn: '2025-01-01', side: 'left', summary: '', muscles: ' ', dose: null, notes: null };
    const r = validateRecord('events', event);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.path).sort()).toEqual(['dose', 'endsOn', 'muscles']);
    expect(validateRecord('events', { ...event, endsOn: null, muscles: 'soleus', dose: '100 units' }).ok).toBe(true);
  });

  it('checks identity fields and dates', () => {
    const identity = { ...base, patientId: P, familyName: 'Quillmere', givenName: 'Alma', dateOfBirth: '1970-02-29', contact: null };
    const r = validateRecord('identities', identity);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.path).toBe('dateOfBirth');
    expect(validateRecord('identities', { ...identity, dateOfBirth: '1972-02-29' }).ok).toBe(true);
  });

  it('keeps trace channels as Float64Array columns of equal length', () => {
    const trace = { ...base, patientId: P, assessmentId: null, kind: 'pendulum-knee-angle', startedAt: base.createdAt, sampleRateHz: 100, channels: [
      { name: 'a', unit: 'deg', samples: new Float64Array(10) },
      { name: 'b', unit: 'deg', samples: new Float64Array(9) },
    ] };
    const r = validateRecord('traces', trace);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.path).toBe('channels');
    expect(validateRecord('traces', { ...trace, channels: [{ name: 'a', unit: 'deg', samples: [1, 2] }] }).ok).toBe(false);
  });

  it('checks reliability studies point at their raters', () => {
    const study = { ...base, title: 't', measureCode: 'rom', siteCode: 'ankle-dorsiflexion', design: 'inter-rater', raterIds: [P], trials: [{ subjectLabel: 'V1', raterIndex: 1, trial: 1, value: 3 }], notes: null };
    expect(validateRecord('reliabilityStudies', study).ok).toBe(false);
  });

  it('parseRecord throws a DomainValidationError naming the table, id and field', () => {
    const assessment = { ...base, patientId: P, assessorId: P, performedAt: '2025-01-01T10:00:00Z', setting: 'clinic', conditions: { position: null, minutesSinceMedication: null, painNrs: 11 }, notes: null };
    try {
      parseRecord('assessments', assessment);
      throw new Error('should throw');
    } catch (error) {
      expect(error).toBeInstanceOf(DomainValidationError);
      const message = (error as Error).message;
      expect(message).toContain(`assessments ${base.id}`);
      expect(message).toContain('performedAt');
      expect(message).toContain('conditions.painNrs');
    }
  });
});
