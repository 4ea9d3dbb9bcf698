import { decimalProblem, decimalValue, withoutByteOrderMark } from '../domain';
import { PendulumInputError } from './pendulum-input-error';

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

/** Lowest and highest knee flexion angle the engine accepts (degrees). */
export const ANGLE_LIMITS_DEG = { min: -30, max: 180 } as const;

type ColumnKind = 'time_s' | 'time_ms' | 'angle_deg' | 'angle_rad' | 'gyro_dps' | 'emg_uv';
const KNOWN_COLUMNS: readonly ColumnKind[] = ['time_s', 'time_ms', 'angle_deg', 'angle_rad', 'gyro_dps', 'emg_uv'];

/**
 * Parses a pendulum recording from CSV text.
 *
 * Format: a header row naming the columns (case-insensitive, any order): `time_s` or `time_ms`;
 * `angle_deg` or `angle_rad`; optional `gyro_dps`; optional `emg_uv`. At least one of angle and gyro.
 * Fields are separated by commas (semicolons or tabs are accepted when the header uses them);
 * fields may be wrapped in double quotes (RFC 4180). Blank lines and lines starting with `#` are
 * skipped but still counted, so row numbers are file line numbers.
 *
 * Cost: one pass over the text, O(rows × columns).
 * Throws PendulumInputError naming the file, the row and the reason for: no header or no data rows,
 * unknown, duplicate or missing columns, a row with the wrong number of fields, a non-numeric or
 * non-finite value, time not strictly increasing, an angle outside -30..180 degrees.
 */
export function parsePendulumCsv(text: string, fileName: string): PendulumTrace {
  text = withoutByteOrderMark(text);
  let pos = 0;
  let line = 0;
  let header: string | null = null;
  let headerLine = 0;
  while (pos <= text.length) {
    const [start, end, next] = nextLine(text, pos);
    pos = next;
    line++;
    const content = text.slice(start, end).trim();
    if (content === '' || content.startsWith('#')) {
      if (next > text.length) break;
      continue;
    }
    header = content;
    headerLine = line;
    break;
  }
  if (header === null) throw new PendulumInputError(fileName, null, 'empty file: no header row and no data rows');

  const delimiter = header.includes(',') ? ',' : header.includes(';') ? ';' : header.includes('\t') ? '\t' : ',';
  const names = header.split(delimiter).map((n) => unquote(n.trim()).trim().toLowerCase());
  const kinds: ColumnKind[] = [];
  for (const name of names) {
    if (!(KNOWN_COLUMNS as readonly string[]).includes(name)) {
      throw new PendulumInputError(
        fileName,
        headerLine,
        `unknown column "${name}"; expected time_s or time_ms, angle_deg or angle_rad, optional gyro_dps and emg_uv`,
      );
    }
    if (kinds.includes(name as ColumnKind)) throw new PendulumInputError(fileName, headerLine, `column "${name}" appears twice`);
    kinds.push(name as ColumnKind);
  }
  const has = (k: ColumnKind): boolean => kinds.includes(k);
  if (has('time_s') && has('time_ms')) throw new PendulumInputError(fileName, headerLine, 'both time_s and time_ms given; keep one');
  if (has('angle_deg') && has('angle_rad')) throw new PendulumInputError(fileName, headerLine, 'both angle_deg and angle_rad given; keep one');
  if (!has('time_s') && !has('time_ms')) throw new PendulumInputError(fileName, headerLine, 'missing time column (time_s or time_ms)');
  if (!has('angle_deg') && !has('angle_rad') && !has('gyro_dps')) {
    throw new PendulumInputError(fileName, headerLine, 'missing angle column (angle_deg or angle_rad) and no gyro_dps to reconstruct it from');
  }

  // Upper bound on the number of rows: one per remaining line break.
  let capacity = 1;
  for (let i = pos; i < text.length; i++) if (text.charCodeAt(i) === 10) capacity++;
  const columns = kinds.map(() => new Float64Array(capacity));
  const lines = new Int32Array(capacity);
  const timeColumn = kinds.findIndex((k) => k === 'time_s' || k === 'time_ms');
  const angleColumn = kinds.findIndex((k) => k === 'angle_deg' || k === 'angle_rad');
  const timeScale = has('time_ms') ? 1e-3 : 1;
  const angleScale = has('angle_rad') ? 180 / Math.PI : 1;
  const width = kinds.length;

  let rows = 0;
  while (pos <= text.length) {
    const [start, end, next] = nextLine(text, pos);
    pos = next;
    line++;
    // Skip blank and comment lines without allocating.
    let first = start;
    while (first < end && isSpace(text.charCodeAt(first))) first++;
    if (first === end || text.charCodeAt(first) === 35 /* # */) {
      if (next > text.length) break;
      continue;
    }
    let fieldStart = start;
    for (let c = 0; c < width; c++) {
      let fieldEnd = text.indexOf(delimiter, fieldStart);
      if (fieldEnd < 0 || fieldEnd > end) fieldEnd = end;
      if (c < width - 1 && fieldEnd === end) {
        throw new PendulumInputError(fileName, line, `expected ${width} values, found ${c + 1}`);
      }
      const value = decimalValue(text, fieldStart, fieldEnd);
      if (!Number.isFinite(value)) {
        const raw = text.slice(fieldStart, fieldEnd).trim();
        const reason = decimalProblem(raw, value);
        throw new PendulumInputError(fileName, line, `${reason} "${raw.slice(0, 40)}" in column ${names[c]}`);
      }
      columns[c][rows] = value;
      fieldStart = fieldEnd + 1;
    }
    if (fieldStart <= end) {
      let extra = 1;
      for (let i = fieldStart; i < end; i++) if (text.charCodeAt(i) === delimiter.charCodeAt(0)) extra++;
      throw new PendulumInputError(fileName, line, `expected ${width} values, found ${width + extra}`);
    }
    const t = columns[timeColumn][rows] * timeScale;
    columns[timeColumn][rows] = t;
    if (rows > 0 && !(t > columns[timeColumn][rows - 1])) {
      throw new PendulumInputError(
        fileName,
        line,
        `time not strictly increasing (${formatValue(t)} s after ${formatValue(columns[timeColumn][rows - 1])} s)`,
      );
    }
    if (angleColumn >= 0) {
      const angle = columns[angleColumn][rows] * angleScale;
      columns[angleColumn][rows] = angle;
      if (angle < ANGLE_LIMITS_DEG.min || angle > ANGLE_LIMITS_DEG.max) {
        throw new PendulumInputError(
          fileName,
          line,
          `angle ${formatValue(angle)} degrees outside ${ANGLE_LIMITS_DEG.min}..${ANGLE_LIMITS_DEG.max} degrees`,
        );
      }
    }
    lines[rows] = line;
    rows++;
    if (next > text.length) break;
  }
  if (rows === 0) throw new PendulumInputError(fileName, null, 'no data rows after the header');

  const column = (a: ColumnKind, b?: ColumnKind): Float64Array | null => {
    const index = kinds.findIndex((k) => k === a || k === b);
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

/** [start, end, next]: a line's content range and where the next line starts (> length at the end). */
function nextLine(text: string, pos: number): [number, number, number] {
  const newline = text.indexOf('\n', pos);
  if (newline < 0) return [pos, text.length, text.length + 1];
  const end = newline > pos && text.charCodeAt(newline - 1) === 13 ? newline - 1 : newline;
  return [pos, end, newline + 1];
}

function isSpace(code: number): boolean {
  return code === 32 || code === 9 || code === 13;
}

function unquote(field: string): string {
  return field.length >= 2 && field.startsWith('"') && field.endsWith('"') ? field.slice(1, -1).replace(/""/g, '"') : field;
}

function formatValue(x: number): string {
  return String(Math.round(x * 1e6) / 1e6);
}
