import { readDecimal, withoutByteOrderMark } from '../../domain';
import { MotionInputError } from './motion-input-error';
import { MOTION_CSV_COLUMNS, type MotionRecording } from './motion-recording';

/** Largest plausible magnitudes: far beyond any phone sensor's range, so only typing slips exceed them. */
const MAX_RATE_DPS = 10000;
const MAX_ACCELERATION_MS2 = 2000;

/**
 * Parses a device-motion recording from CSV text.
 *
 * Format: a header naming the seven columns of MOTION_CSV_COLUMNS (any order, case-insensitive):
 * `time_ms, rate_alpha_dps, rate_beta_dps, rate_gamma_dps, acc_x_ms2, acc_y_ms2, acc_z_ms2`, then one
 * row per sample. Rotation rates follow the current W3C text: rate_alpha_dps about device x,
 * rate_beta_dps about y, rate_gamma_dps about z (RATE_AXES_NOTE). Comma-separated; a field may be wrapped in double quotes (RFC 4180); blank lines and
 * lines starting with `#` are skipped but counted, so row numbers are file line numbers.
 *
 * Cost: one pass, O(rows). Throws MotionInputError (file, row, reason) for: no header or no data rows,
 * an unknown, duplicate or missing column, a row with the wrong number of fields, a value that is not
 * a finite number, a rotation rate beyond ±10,000 deg/s or an acceleration beyond ±2,000 m/s², time
 * not strictly increasing.
 */
export function parseMotionCsv(text: string, fileName: string): MotionRecording {
  const rows = withoutByteOrderMark(text).split(/\r\n|\n|\r/);
  let headerLine = -1;
  for (let i = 0; i < rows.length; i++) {
    const content = rows[i].trim();
    if (content !== '' && !content.startsWith('#')) {
      headerLine = i;
      break;
    }
  }
  if (headerLine < 0) throw new MotionInputError(fileName, null, 'no header row (expected ' + MOTION_CSV_COLUMNS.join(',') + ')');
  const names = splitFields(rows[headerLine]).map((f) => f.trim().toLowerCase());
  const order = new Int32Array(MOTION_CSV_COLUMNS.length).fill(-1);
  names.forEach((name, c) => {
    const k = (MOTION_CSV_COLUMNS as readonly string[]).indexOf(name);
    if (k < 0) throw new MotionInputError(fileName, headerLine + 1, `unknown column "${name}" (expected ${MOTION_CSV_COLUMNS.join(',')})`);
    if (order[k] >= 0) throw new MotionInputError(fileName, headerLine + 1, `column "${name}" appears twice`);
    order[k] = c;
  });
  const missing = MOTION_CSV_COLUMNS.filter((_, k) => order[k] < 0);
  if (missing.length > 0) throw new MotionInputError(fileName, headerLine + 1, `missing column${missing.length > 1 ? 's' : ''} ${missing.join(', ')}`);

  const capacity = rows.length - headerLine;
  const columns = MOTION_CSV_COLUMNS.map(() => new Float64Array(capacity));
  const lines = new Int32Array(capacity);
  let n = 0;
  for (let r = headerLine + 1; r < rows.length; r++) {
    const content = rows[r].trim();
    if (content === '' || content.startsWith('#')) continue;
    const line = r + 1;
    const fields = splitFields(rows[r]);
    if (fields.length !== names.length) {
      throw new MotionInputError(fileName, line, `${fields.length} field${fields.length === 1 ? '' : 's'}, the header has ${names.length}`);
    }
    for (let k = 0; k < MOTION_CSV_COLUMNS.length; k++) {
      const raw = fields[order[k]].trim();
      const reading = readDecimal(raw);
      const name = MOTION_CSV_COLUMNS[k];
      if (!reading.ok) throw new MotionInputError(fileName, line, `${reading.reason} "${raw.slice(0, 40)}" in column ${name}`);
      const value = reading.value;
      const limit = k === 0 ? Infinity : k <= 3 ? MAX_RATE_DPS : MAX_ACCELERATION_MS2;
      if (Math.abs(value) > limit) throw new MotionInputError(fileName, line, `${name} ${value} is beyond ±${limit}`);
      columns[k][n] = value;
    }
    if (n > 0 && !(columns[0][n] > columns[0][n - 1])) throw new MotionInputError(fileName, line, 'time_ms not strictly increasing');
    lines[n] = line;
    n++;
  }
  if (n === 0) throw new MotionInputError(fileName, null, 'no data rows');
  const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = columns.map((c) => c.slice(0, n));
  return { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2, lines: lines.slice(0, n) };
}

/** Splits one CSV row on commas, honouring double-quoted fields (RFC 4180, "" inside quotes). */
function splitFields(row: string): string[] {
  const fields: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < row.length; i++) {
    const ch = row[i];
    if (quoted) {
      if (ch === '"' && row[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') {
        quoted = false;
      } else {
        field += ch;
      }
    } else if (ch === '"') {
      quoted = true;
    } else if (ch === ',') {
      fields.push(field);
      field = '';
    } else {
      field += ch;
    }
  }
  fields.push(field);
  return fields;
}
