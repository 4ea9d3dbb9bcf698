import { ANGLE_LIMITS_DEG, decimalProblem, decimalValue, RecordingInputError } from '../domain';
import { roundTo } from '../stats';
import { isSpace, nextLine } from './csv-lines';
import type { PendulumCsvHeader } from './pendulum-csv-header';

/** The data rows as one Float64Array per header column (time in s, angle in degrees) and their file lines. */
export interface PendulumCsvRows {
  readonly columns: readonly Float64Array[];
  readonly lines: Int32Array;
  readonly rows: number;
}

/**
 * Step 2 of parsePendulumCsv: reads every data row after the header (blank and `#` lines skipped but
 * counted), scaling time_ms to seconds and angle_rad to degrees. Throws RecordingInputError (file, row,
 * reason) for a wrong number of fields, a non-numeric value, time not strictly increasing, an angle
 * outside ANGLE_LIMITS_DEG, or no data rows.
 */
export function readPendulumCsvRows(text: string, fileName: string, header: PendulumCsvHeader): PendulumCsvRows {
  const { kinds } = header;
  let { pos, line } = header;
  // Upper bound on the number of rows: one per remaining line break.
  let capacity = 1;
  for (let i = pos; i < text.length; i++) if (text.charCodeAt(i) === 10) capacity++;
  const columns = kinds.map(() => new Float64Array(capacity));
  const lines = new Int32Array(capacity);
  const time = columns[kinds.findIndex((k) => k === 'time_s' || k === 'time_ms')];
  const angleColumn = kinds.findIndex((k) => k === 'angle_deg' || k === 'angle_rad');
  const timeScale = kinds.includes('time_ms') ? 1e-3 : 1;
  const angleScale = kinds.includes('angle_rad') ? 180 / Math.PI : 1;
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
    readFields(text, start, end, fileName, line, header, columns, rows);
    const t = (time[rows] *= timeScale);
    if (rows > 0 && !(t > time[rows - 1])) {
      throw new RecordingInputError(fileName, line, `time not strictly increasing (${formatValue(t)} s after ${formatValue(time[rows - 1])} s)`);
    }
    if (angleColumn >= 0) {
      const angle = (columns[angleColumn][rows] *= angleScale);
      if (angle < ANGLE_LIMITS_DEG.min || angle > ANGLE_LIMITS_DEG.max) {
        throw new RecordingInputError(fileName, line, `angle ${formatValue(angle)} degrees outside ${ANGLE_LIMITS_DEG.min}..${ANGLE_LIMITS_DEG.max} degrees`);
      }
    }
    lines[rows] = line;
    rows++;
    if (next > text.length) break;
  }
  if (rows === 0) throw new RecordingInputError(fileName, null, 'no data rows after the header');
  return { columns, lines, rows };
}

/** Reads one row's fields into columns[c][row]; refuses a wrong count or a value that is no decimal. */
function readFields(text: string, start: number, end: number, fileName: string, line: number, header: PendulumCsvHeader, columns: Float64Array[], row: number): void {
  const { delimiter, names } = header;
  const width = header.kinds.length;
  let fieldStart = start;
  for (let c = 0; c < width; c++) {
    let fieldEnd = text.indexOf(delimiter, fieldStart);
    if (fieldEnd < 0 || fieldEnd > end) fieldEnd = end;
    if (c < width - 1 && fieldEnd === end) throw new RecordingInputError(fileName, line, `expected ${width} values, found ${c + 1}`);
    const value = decimalValue(text, fieldStart, fieldEnd);
    if (!Number.isFinite(value)) {
      const raw = text.slice(fieldStart, fieldEnd).trim();
      throw new RecordingInputError(fileName, line, `${decimalProblem(raw, value)} "${raw.slice(0, 40)}" in column ${names[c]}`);
    }
    columns[c][row] = value;
    fieldStart = fieldEnd + 1;
  }
  if (fieldStart <= end) {
    let extra = 1;
    for (let i = fieldStart; i < end; i++) if (text.charCodeAt(i) === delimiter.charCodeAt(0)) extra++;
    throw new RecordingInputError(fileName, line, `expected ${width} values, found ${width + extra}`);
  }
}

function formatValue(x: number): string {
  return String(roundTo(x, 6));
}
