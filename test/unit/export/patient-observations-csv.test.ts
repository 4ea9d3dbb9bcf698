import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { ClinicalEvent, Observation } from '../../../src/lib/domain';
import { anEvent, anObservation } from '../../support/records';
import { localDateTime, patientObservationsCsv } from '../../../src/lib/export';
import { eventContext, PATIENT_CSV_COLUMNS } from '../../../src/lib/export/patient-observations-csv';

const obs = (id: string, takenAt: string, extra: Partial<Observation>): Observation => anObservation({ id, assessmentId: `a-${id}`, takenAt, ...extra });
const injection: ClinicalEvent = anEvent({ summary: '=HYPERLINK("x")' });

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
      { timeZone: 'Europe/Berlin' },
    );
    expect(text.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true, delimiter: ',' });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...PATIENT_CSV_COLUMNS]);
    // Berlin keeps CET (UTC+1) in January and March before the last Sunday (IANA tz database, Europe/Berlin rules).
    expect(parsed.data.map((r) => [r.date, r.time, r.taken_at])).toEqual([
      ['2026-01-15', '11:00', '2026-01-15T11:00:00+01:00'],
      ['2026-03-01', '11:00', '2026-03-01T11:00:00+01:00'],
      ['2026-03-01', '11:00', '2026-03-01T11:00:00+01:00'],
    ]);
    // Modified Ashworth: the grade label and its named rank; no bare rank under value.
    expect(parsed.data[0]).toMatchObject({ patient_code: 'K7QM-3XHD', measure_code: 'mas', grade: '2', grade_rank: '3', value: '', unit: '', verdict: 'baseline', event_context: '' });
    // 2 → 1+ is one grade step down, judged by the one-step rule: improved.
    expect(parsed.data[1]).toMatchObject({ grade: '1+', grade_rank: '2', baseline_date: '2026-01-15', change_from_baseline: '-1', change_unit: 'grade steps', mdc: '1', mdc_source: 'rule', verdict: 'improved', event_context: '28 days after botulinum-toxin-injection on 2026-02-01' });
    expect(parsed.data[2]).toMatchObject({ measure_code: 'tardieu', r1_deg: '60', r2_deg: '95', quality_grade: '2', value: '35', unit: 'deg (R2 − R1)', verdict: 'baseline' });
    expect(text).not.toMatch(/\{grade\}|Z,/);
  });

  it('neutralises a cell that a spreadsheet would run as a formula (OWASP CSV Injection guidance)', () => {
    const text = patientObservationsCsv('=cmd|calc', [obs('1', '2026-01-15T10:00:00.000Z', {})], [], { timeZone: 'UTC' });
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true, delimiter: ',' });
    expect(parsed.data[0]?.patient_code).toBe("'=cmd|calc");
  });

  it('event context names the latest event on or before the observation, counting whole days', () => {
    expect(eventContext(Date.parse('2026-02-01T00:00:00Z'), [injection])).toBe('0 days after botulinum-toxin-injection on 2026-02-01');
    expect(eventContext(Date.parse('2026-02-02T09:00:00Z'), [injection])).toBe('1 day after botulinum-toxin-injection on 2026-02-01');
    expect(eventContext(Date.parse('2026-01-31T23:59:59Z'), [injection])).toBe('');
    expect(eventContext(Date.parse('2026-02-05T00:00:00Z'), [{ ...injection, deleted: true }])).toBe('');
  });

  it('local date, time and offset across a summer-time change (IANA tz database: Europe/Berlin, America/New_York)', () => {
    const cases = [
      { input: ['2026-03-29T00:30:00Z', 'Europe/Berlin'], expected: '2026-03-29T01:30:00+01:00' },
      { input: ['2026-03-29T01:30:00Z', 'Europe/Berlin'], expected: '2026-03-29T03:30:00+02:00' },
      { input: ['2026-07-01T23:30:00Z', 'America/New_York'], expected: '2026-07-01T19:30:00-04:00' },
      { input: ['2026-01-01T02:00:00Z', 'America/New_York'], expected: '2025-12-31T21:00:00-05:00' },
      { input: ['2026-06-01T12:00:00Z', 'Asia/Kolkata'], expected: '2026-06-01T17:30:00+05:30' },
    ] as const;
    for (const c of cases) expect(localDateTime(Date.parse(c.input[0]), c.input[1]).iso).toBe(c.expected);
    expect(() => localDateTime(0, 'Not/AZone')).toThrow(RangeError);
  });
});
