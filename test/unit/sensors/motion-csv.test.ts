import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatMotionCsv, MotionInputError, parseMotionCsv, type MotionRecording } from '../../../src/lib/sensors';

const HEADER = 'time_ms,rate_alpha_dps,rate_beta_dps,rate_gamma_dps,acc_x_ms2,acc_y_ms2,acc_z_ms2';

describe('parseMotionCsv', () => {
  it('reads the columns in any order, skips comments and blank lines, counts file lines', () => {
    const text = '# phone test\nacc_z_ms2,TIME_MS,rate_alpha_dps,rate_beta_dps,rate_gamma_dps,acc_x_ms2,acc_y_ms2\n9.8,0,1,2,3,0.1,0.2\n\n"9.7",16.5,4,5,6,0.3,0.4\n';
    const r = parseMotionCsv(text, 'f.csv');
    expect(Array.from(r.timeMs)).toEqual([0, 16.5]);
    expect(Array.from(r.accZMs2)).toEqual([9.8, 9.7]);
    expect(Array.from(r.rateGammaDps)).toEqual([3, 6]);
    expect(Array.from(r.lines ?? [])).toEqual([3, 5]);
  });

  // Each refusal names file, row and reason.
  const refusals: Array<{ text: string; message: RegExp }> = [
    { text: '', message: /^f\.csv: no header row/ },
    { text: `${HEADER}\n`, message: /^f\.csv: no data rows$/ },
    { text: HEADER.replace('acc_y_ms2', 'acc_q_ms2'), message: /^f\.csv: row 1: unknown column "acc_q_ms2"/ },
    { text: `${HEADER},time_ms`, message: /^f\.csv: row 1: column "time_ms" appears twice/ },
    { text: HEADER.replace(',acc_z_ms2', ''), message: /^f\.csv: row 1: missing column acc_z_ms2/ },
    { text: `${HEADER}\n0,0,0,0,0,0\n`, message: /^f\.csv: row 2: 6 fields, the header has 7/ },
    { text: `${HEADER}\n0,0,0,0,0,0,x\n`, message: /^f\.csv: row 2: non-numeric value "x" in column acc_z_ms2/ },
    { text: `${HEADER}\n0,0,0,0,0,0,Infinity\n`, message: /^f\.csv: row 2: non-finite value "Infinity" in column acc_z_ms2/ },
    { text: `${HEADER}\n0,0,0,0,0,0,\n`, message: /^f\.csv: row 2: empty value "" in column acc_z_ms2/ },
    { text: `${HEADER}\n0,20000,0,0,0,0,9.8\n`, message: /^f\.csv: row 2: rate_alpha_dps 20000 is beyond ±10000/ },
    { text: `${HEADER}\n5,0,0,0,0,0,9.8\n5,0,0,0,0,0,9.8\n`, message: /^f\.csv: row 3: time_ms not strictly increasing/ },
  ];
  for (const { text, message } of refusals) {
    it(`refuses ${message.source}`, () => {
      expect(() => parseMotionCsv(text, 'f.csv')).toThrow(MotionInputError);
      expect(() => parseMotionCsv(text, 'f.csv')).toThrow(message);
    });
  }

  it('round trip: formatMotionCsv then parseMotionCsv gives the values back (to the written precision)', () => {
    const value = fc.double({ min: -2000, max: 2000, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 0.01, max: 100, noNaN: true }), value, value, value, value, value, value), { minLength: 1, maxLength: 40 }), (rows) => {
        let t = 0;
        const cols = Array.from({ length: 7 }, () => new Float64Array(rows.length));
        rows.forEach((row, i) => {
          t += Math.round(row[0] * 1000) / 1000 + 0.001;
          cols[0][i] = Math.round(t * 1000) / 1000;
          for (let k = 1; k < 7; k++) cols[k][i] = Math.round(row[k] * 1e4) / 1e4;
        });
        const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = cols;
        const rec: MotionRecording = { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 };
        const back = parseMotionCsv(formatMotionCsv(rec), 'r.csv');
        for (const key of ['timeMs', 'rateAlphaDps', 'rateBetaDps', 'rateGammaDps', 'accXMs2', 'accYMs2', 'accZMs2'] as const) {
          const a = rec[key];
          const b = back[key];
          for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-9 * Math.max(1, Math.abs(a[i])));
        }
      }),
      { numRuns: 60, seed: 9 },
    );
  });
});
