import { MOTION_CSV_COLUMNS, motionSampleCount, type MotionRecording } from './motion-recording';

/**
 * Writes a motion recording as CSV in the format parseMotionCsv reads (header MOTION_CSV_COLUMNS,
 * CRLF line ends per RFC 4180). Time keeps 3 decimals (microseconds), the sensor values 4, which is
 * finer than the 0.1 deg/s and 0.1 m/s² steps browsers deliver. O(n).
 */
export function formatMotionCsv(recording: MotionRecording): string {
  const n = motionSampleCount(recording);
  const cols = [recording.timeMs, recording.rateAlphaDps, recording.rateBetaDps, recording.rateGammaDps, recording.accXMs2, recording.accYMs2, recording.accZMs2];
  const out: string[] = [MOTION_CSV_COLUMNS.join(',')];
  for (let i = 0; i < n; i++) {
    out.push(cols.map((c, k) => trimNumber(c[i], k === 0 ? 3 : 4)).join(','));
  }
  return `${out.join('\r\n')}\r\n`;
}

/** Writes a reconstructed angle trace as CSV `time_s,angle_deg` (the pendulum command's input format). */
export function formatAngleTraceCsv(timeS: Float64Array, angleDeg: Float64Array): string {
  const out: string[] = ['time_s,angle_deg'];
  for (let i = 0; i < timeS.length; i++) out.push(`${trimNumber(timeS[i], 6)},${trimNumber(angleDeg[i], 4)}`);
  return `${out.join('\r\n')}\r\n`;
}

function trimNumber(x: number, digits: number): string {
  const s = x.toFixed(digits);
  const trimmed = s.includes('.') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
  return trimmed === '-0' ? '0' : trimmed;
}
