import { describe, expect, it } from 'vitest';
import { ordinalValue, tardieuValue, validateRecord, type Observation } from '../../../src/lib/domain';

const base = {
  id: '0190a0b0-0000-7000-8000-000000000001',
  createdAt: '2025-01-01T10:00:00.000Z',
  updatedAt: '2025-01-01T10:00:00.000Z',
  deviceId: '0190a0b0-0000-7000-8000-000000000002',
  clinicianId: '0190a0b0-0000-7000-8000-000000000003',
  deleted: false,
  patientId: '0190a0b0-0000-7000-8000-000000000004',
  assessmentId: '0190a0b0-0000-7000-8000-000000000005',
  takenAt: '2025-01-01T10:00:00.000Z',
  mode: null,
  instrument: null,
  traceId: null,
};
const obs = (o: Partial<Observation>) => ({ ...base, ...o });

const valid: [string, object][] = [
  ['MAS 1+', obs({ measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', value: ordinalValue('mas', '1+') })],
  ['Tardieu elbow', obs({ measureCode: 'tardieu', siteCode: 'elbow-flexors', side: 'right', value: tardieuValue(40, 120, 2) })],
  // The issue's example: an ankle catch 10° short of neutral (0° = foot at 90° to the leg).
  ['Tardieu ankle R1 −10°', obs({ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'right', value: tardieuValue(-10, 15, 2) })],
  ['ROM ankle contracture', obs({ measureCode: 'rom', siteCode: 'ankle-dorsiflexion', side: 'right', mode: 'passive', instrument: 'universal-goniometer', value: { kind: 'angle', angleDeg: -20 } })],
  ['pendulum RI', obs({ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', value: { kind: 'index', value: 1.2 } })],
  ['swing count', obs({ measureCode: 'pendulum-swing-count', siteCode: 'knee', side: 'left', value: { kind: 'count', value: 4 } })],
  ['Penn', obs({ measureCode: 'penn-spasm-frequency', siteCode: 'whole-body', side: 'none', value: { kind: 'rating', value: 4 } })],
];

const invalid: [string, object, string][] = [
  ['unknown measure', obs({ measureCode: 'xyz', siteCode: 'knee', side: 'left', value: { kind: 'index', value: 1 } }), 'measureCode'],
  ['unknown site', obs({ measureCode: 'mas', siteCode: 'nose', side: 'left', value: ordinalValue('mas', '2') }), 'siteCode'],
  ['MAS without side', obs({ measureCode: 'mas', siteCode: 'elbow-flexors', side: 'none', value: ordinalValue('mas', '2') }), 'side'],
  ['Penn with a side', obs({ measureCode: 'penn-spasm-frequency', siteCode: 'whole-body', side: 'left', value: { kind: 'rating', value: 1 } }), 'side'],
  ['MAS grade 5', obs({ measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', value: { kind: 'ordinal', grade: '5', rank: 5 } }), 'value.grade'],
  ['MAS rank mismatch', obs({ measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', value: { kind: 'ordinal', grade: '1+', rank: 1 } }), 'value.rank'],
  ['Tardieu R1 > R2', obs({ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'left', value: tardieuValue(20, 10, 2) }), 'value.r1Deg'],
  ['Tardieu ankle 60° (beyond dorsiflexion limits)', obs({ measureCode: 'tardieu', siteCode: 'ankle-gastrocnemius', side: 'left', value: tardieuValue(10, 60, 2) }), 'value.r2Deg'],
  ['Tardieu elbow −5° (below the shortest position)', obs({ measureCode: 'tardieu', siteCode: 'elbow-flexors', side: 'left', value: tardieuValue(-5, 60, 2) }), 'value.r1Deg'],
  ['Tardieu wrong derived angle', obs({ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'left', value: { kind: 'tardieu', r1Deg: -10, r2Deg: 10, quality: 2, spasticityAngleDeg: 25 } }), 'value.spasticityAngleDeg'],
  ['Tardieu quality 6', obs({ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'left', value: tardieuValue(0, 10, 6) }), 'value.quality'],
  ['ROM typing slip 1500°', obs({ measureCode: 'rom', siteCode: 'elbow-flexion', side: 'left', mode: 'active', instrument: 'inclinometer', value: { kind: 'angle', angleDeg: 1500 } }), 'value.angleDeg'],
  ['ROM above hypermobility margin', obs({ measureCode: 'rom', siteCode: 'knee-extension', side: 'left', mode: 'passive', instrument: 'inclinometer', value: { kind: 'angle', angleDeg: 16 } }), 'value.angleDeg'],
  ['ROM without mode', obs({ measureCode: 'rom', siteCode: 'elbow-flexion', side: 'left', instrument: 'inclinometer', value: { kind: 'angle', angleDeg: 100 } }), 'mode'],
  ['ROM without instrument', obs({ measureCode: 'rom', siteCode: 'elbow-flexion', side: 'left', mode: 'active', value: { kind: 'angle', angleDeg: 100 } }), 'instrument'],
  ['MAS with instrument', obs({ measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', instrument: 'inclinometer', value: ordinalValue('mas', '2') }), 'instrument'],
  ['kind mismatch', obs({ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', value: { kind: 'angle', angleDeg: 1 } }), 'value.kind'],
  ['RI negative', obs({ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', value: { kind: 'index', value: -0.1 } }), 'value.value'],
  ['Penn 5', obs({ measureCode: 'penn-spasm-frequency', siteCode: 'whole-body', side: 'none', value: { kind: 'rating', value: 5 } }), 'value.value'],
  ['NaN angle', obs({ measureCode: 'pendulum-first-swing', siteCode: 'knee', side: 'left', value: { kind: 'angle', angleDeg: Number.NaN } }), 'value.angleDeg'],
  ['swing count 2.5', obs({ measureCode: 'pendulum-swing-count', siteCode: 'knee', side: 'left', value: { kind: 'count', value: 2.5 } }), 'value.value'],
  ['bad takenAt', obs({ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', takenAt: '2025-02-30T10:00:00.000Z', value: { kind: 'index', value: 1 } }), 'takenAt'],
  ['extra field', { ...obs({ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', value: { kind: 'index', value: 1 } }), colour: 'red' }, 'colour'],
];

describe('observation validation (schema + catalogue)', () => {
  it.each(valid)('accepts %s', (_name, record) => {
    const result = validateRecord('observations', record);
    expect(result.ok ? [] : result.issues).toEqual([]);
  });
  it.each(invalid)('refuses %s, naming %s', (_name, record, path) => {
    const result = validateRecord('observations', record);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues.map((i) => i.path)).toContain(path);
  });
  it('accepts exactly the same ankle angles in a Tardieu row as in the ROM ankle dorsiflexion row', () => {
    for (let angle = -80; angle <= 50; angle += 0.5) {
      const rom = validateRecord('observations', obs({ measureCode: 'rom', siteCode: 'ankle-dorsiflexion', side: 'left', mode: 'passive', instrument: 'universal-goniometer', value: { kind: 'angle', angleDeg: angle } })).ok;
      for (const siteCode of ['ankle-soleus', 'ankle-gastrocnemius']) {
        const tardieu = validateRecord('observations', obs({ measureCode: 'tardieu', siteCode, side: 'left', value: tardieuValue(angle, angle, 2) })).ok;
        expect(tardieu, `${siteCode} at ${angle}°`).toBe(rom);
      }
    }
    // The limits themselves are the ROM rule's (AAOS plantarflexion 50° and dorsiflexion 20°, FROM MEMORY, + 15° margin).
    expect(validateRecord('observations', obs({ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'left', value: tardieuValue(-65, 35, 2) })).ok).toBe(true);
    expect(validateRecord('observations', obs({ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'left', value: tardieuValue(-65.5, 35, 2) })).ok).toBe(false);
  });
  it('builders refuse unknown grades', () => {
    expect(() => ordinalValue('mas', '1-')).toThrow(RangeError);
    expect(() => ordinalValue('rom', '1')).toThrow(RangeError);
    expect(tardieuValue(10, 30, 2).spasticityAngleDeg).toBe(20);
  });
});
