import { withoutByteOrderMark } from '../domain';
import { readPendulumCsvHeader, type ColumnKind } from './pendulum-csv-header';
import { readPendulumCsvRows } from './read-pendulum-csv-rows';

/** One recording as columns, in the file's own time base (seconds) and units (degrees, deg/s, µV). */
export interface PendulumTrace {
  readonly timeS: Float64Array;
  /** Knee flexion angle (0 = full extension, positive as the knee bends), or null for gyro-only input. */
  readonly angleDeg: Float64Array | null;
  /** Knee angular velocity, positive in flexion, or null. */
  readonly gyroDps: Float64Array | null;
  /** One raw EMG channel, or null. */
  readonly emgUv: Float64Array | null;
  /** 1-based line of each sample in the file (header = line 1), for messages. */
  readonly lines: Int32Array;
}

/**
 * Parses a pendulum recording from CSV text.
 *
 * Format: a header row naming the columns (case-insensitive, any order): `time_s` or `time_ms`;
 * `angle_deg` or `angle_rad`; optional `gyro_dps`; optional `emg_uv`. At least one of angle and gyro.
 * Fields are separated by commas (semicolons or tabs are accepted when the header uses them);
 * fields may be wrapped in double quotes (RFC 4180). Blank lines and lines starting with `#` are
 * skipped but still counted, so row numbers are file line numbers.
 *
 * Steps: the header (pendulum-csv-header), then the rows (read-pendulum-csv-rows).
 * Cost: one pass over the text, O(rows × columns).
 * Throws RecordingInputError (PendulumInputError) naming the file, the row and the reason for: no header or no data rows,
 * unknown, duplicate or missing columns, a row with the wrong number of fields, a non-numeric or
 * non-finite value, time not strictly increasing, an angle outside ANGLE_LIMITS_DEG (−30..180 degrees).
 *
 * @example
 * const trace = parsePendulumCsv('time_s,angle_deg\n0,2.5\n0.01,2.6\n', 'swing.csv');
 * trace.angleDeg; // Float64Array [2.5, 2.6]; trace.lines: Int32Array [2, 3]
 */
export function parsePendulumCsv(text: string, fileName: string): PendulumTrace {
  text = withoutByteOrderMark(text);
  const header = readPendulumCsvHeader(text, fileName);
  const { columns, lines, rows } = readPendulumCsvRows(text, fileName, header);
  const column = (a: ColumnKind, b?: ColumnKind): Float64Array | null => {
    const index = header.kinds.findIndex((k) => k === a || k === b);
    return index < 0 ? null : columns[index].slice(0, rows);
  };
  return {
    timeS: column('time_s', 'time_ms') as Float64Array,
    angleDeg: column('angle_deg', 'angle_rad'),
    gyroDps: column('gyro_dps'),
    emgUv: column('emg_uv'),
    lines: lines.slice(0, rows),
  };
}
