import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { ClinicalEvent, Observation } from '../../../src/lib/domain';
import { eventContext, patientObservationsCsv, PATIENT_CSV_COLUMNS } from '../../../src/lib/export';

const base = { createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z', deviceId: 'd', clinicianId: 'c', deleted: false, patientId: 'p' };
const obs = (id: string, takenAt: string, extra: Partial<Observation>): Observation =>
  ({ ...base, id, assessmentId: `a-${id}`, takenAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '2', rank: 3 }, traceId: null, ...extra }) as Observation;
const injection: ClinicalEvent = { ...base, id: 'e1', kind: 'botulinum-toxin-injection', occurredOn: '2026-02-01', endsOn: null, side: 'left', summary: '=HYPERLINK("x")', muscles: 'biceps', dose: '100 units', notes: null };

describe('patientObservationsCsv (RFC 4180, one row per observation)', () => {
  it('writes every observation in time order, parses back with papaparse, and leaves out tombstones', () => {
    const text = patientObservationsCsv(
      'K7QM-3XHD',
      [
        obs('2', '2026-03-01T10:00:00.000Z', { value: { kind: 'ordinal', grade: '1+', rank: 2 } }),
        obs('1', '2026-01-15T10:00:00.000Z', {}),
        obs('3', '2026-03-01T10:00:00.000Z', { measureCode: 'tardieu', siteCode: 'ankle-soleus', value: { kind: 'tardieu', r1Deg: 60, r2Deg: 95, quality: 2, spasticityAngleDeg: 35 } }),
        obs('4', '2026-03-02T10:00:00.000Z', { deleted: true }),
      ],
      [injection],
    );
    expect(text.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true, delimiter: ',' });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...PATIENT_CSV_COLUMNS]);
    expect(parsed.data.map((r) => r.assessment_date)).toEqual(['2026-01-15T10:00:00.000Z', '2026-03-01T10:00:00.000Z', '2026-03-01T10:00:00.000Z']);
    expect(parsed.data[0]).toMatchObject({ patient_code: 'K7QM-3XHD', measure_code: 'mas', grade: '2', value: '3', unit: 'grade rank', event_context: '' });
    expect(parsed.data[1]).toMatchObject({ grade: '1+', event_context: '28 days after botulinum-toxin-injection on 2026-02-01' });
    expect(parsed.data[2]).toMatchObject({ measure_code: 'tardieu', r1_deg: '60', r2_deg: '95', quality: '2', value: '35', unit: 'deg' });
  });

  it('neutralises a cell that a spreadsheet would run as a formula (OWASP CSV Injection guidance)', () => {
    const text = patientObservationsCsv('=cmd|calc', [obs('1', '2026-01-15T10:00:00.000Z', {})], []);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true, delimiter: ',' });
    expect(parsed.data[0]?.patient_code).toBe("'=cmd|calc");
  });

  it('event context names the latest event on or before the observation, counting whole days', () => {
    expect(eventContext(Date.parse('2026-02-01T00:00:00Z'), [injection])).toBe('0 days after botulinum-toxin-injection on 2026-02-01');
    expect(eventContext(Date.parse('2026-02-02T09:00:00Z'), [injection])).toBe('1 day after botulinum-toxin-injection on 2026-02-01');
    expect(eventContext(Date.parse('2026-01-31T23:59:59Z'), [injection])).toBe('');
    expect(eventContext(Date.parse('2026-02-05T00:00:00Z'), [{ ...injection, deleted: true }])).toBe('');
  });
});
