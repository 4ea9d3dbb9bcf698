import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { PendulumInputError } from '../../../src/lib/pendulum/index';
import { parsePendulumCsv } from '../../../src/lib/pendulum/parse-pendulum-csv';

function refusal(text: string): PendulumInputError {
  try {
    parsePendulumCsv(text, 'leg.csv');
  } catch (error) {
    if (error instanceof PendulumInputError) return error;
    throw error;
  }
  throw new Error('expected a refusal');
}

describe('parsePendulumCsv', () => {
  it('reads the columns and agrees with papaparse (5.7.1, dynamicTyping) on a valid file', () => {
    const text = 'time_s,angle_deg,gyro_dps,emg_uv\n0.000,1.5,0.1,-3\n0.010,2.25,-0.2,4.5e1\n0.020,3,1E-2,0\n';
    const trace = parsePendulumCsv(text, 'leg.csv');
    const oracle = Papa.parse<Record<string, number>>(text, { header: true, dynamicTyping: true, skipEmptyLines: true }).data;
    expect(trace.timeS.length).toBe(oracle.length);
    oracle.forEach((row, i) => {
      expect(trace.timeS[i]).toBe(row.time_s);
      expect(trace.angleDeg?.[i]).toBe(row.angle_deg);
      expect(trace.gyroDps?.[i]).toBe(row.gyro_dps);
      expect(trace.emgUv?.[i]).toBe(row.emg_uv);
    });
    expect(Array.from(trace.lines)).toEqual([2, 3, 4]);
  });

  it('converts time_ms to seconds and angle_rad to degrees; accepts BOM, CRLF, quotes, comments, any order', () => {
    const text = '\ufeff# recorded 2024\r\n"Angle_Rad";time_ms\r\n\r\n0.5;100\r\n"1";110\r\n';
    const trace = parsePendulumCsv(text, 'leg.csv');
    expect(Array.from(trace.timeS)).toEqual([0.1, 0.11]);
    expect(trace.angleDeg?.[0]).toBeCloseTo((0.5 * 180) / Math.PI, 12);
    expect(trace.angleDeg?.[1]).toBeCloseTo(180 / Math.PI, 12);
    expect(Array.from(trace.lines)).toEqual([4, 5]);
    expect(trace.gyroDps).toBeNull();
  });

  it('reads gyro-only files', () => {
    const trace = parsePendulumCsv('time_s,gyro_dps\n0,1\n1,2\n', 'g.csv');
    expect(trace.angleDeg).toBeNull();
    expect(Array.from(trace.gyroDps ?? [])).toEqual([1, 2]);
  });

  const cases: { text: string; line: number | null; reason: RegExp }[] = [
    { text: '', line: null, reason: /empty file/ },
    { text: 'time_s,angle_deg\n', line: null, reason: /no data rows/ },
    { text: 'time_s,angle_deg,torque\n0,1,2\n', line: 1, reason: /unknown column "torque"/ },
    { text: 'time_s,emg_uv\n0,1\n', line: 1, reason: /missing angle column/ },
    { text: 'angle_deg\n1\n', line: 1, reason: /missing time column/ },
    { text: 'time_s,time_ms,angle_deg\n0,0,1\n', line: 1, reason: /both time_s and time_ms/ },
    { text: 'time_s,angle_deg,angle_deg\n0,1,1\n', line: 1, reason: /appears twice/ },
    { text: 'time_s,angle_deg\n0,1\n0.1\n', line: 3, reason: /expected 2 values, found 1/ },
    { text: 'time_s,angle_deg\n0,1,5\n', line: 2, reason: /expected 2 values, found 3/ },
    { text: 'time_s,angle_deg\n0,1\n0.1,x1\n', line: 3, reason: /non-numeric value "x1" in column angle_deg/ },
    { text: 'time_s,angle_deg\n0,1\n0.1,0x10\n', line: 3, reason: /non-numeric/ },
    { text: 'time_s,angle_deg\n0,1\n0.1,\n', line: 3, reason: /empty value/ },
    { text: 'time_s,angle_deg\n0,1\n0.1,Infinity\n', line: 3, reason: /non-finite/ },
    { text: 'time_s,angle_deg\n0,1\n0.1,1e999\n', line: 3, reason: /non-finite/ },
    { text: 'time_s,angle_deg\n0,1\n# note\n0.1,2\n0.1,3\n', line: 5, reason: /time not strictly increasing/ },
    { text: 'time_s,angle_deg\n0,1\n0.1,-31\n', line: 3, reason: /-31 degrees outside -30..180/ },
    { text: 'time_s,angle_rad\n0,1\n0.1,3.2\n', line: 3, reason: /outside -30..180/ },
  ];
  it.each(cases)('refuses with row $line: $reason', ({ text, line, reason }) => {
    const error = refusal(text);
    expect(error.line).toBe(line);
    expect(error.fileName).toBe('leg.csv');
    expect(error.reason).toMatch(reason);
    expect(error.message).toContain('leg.csv');
    if (line !== null) expect(error.message).toContain(`row ${line}`);
  });

  it('accepts the angle limits themselves', () => {
    const trace = parsePendulumCsv('time_s,angle_deg\n0,-30\n1,180\n', 'x.csv');
    expect(Array.from(trace.angleDeg ?? [])).toEqual([-30, 180]);
  });
});
