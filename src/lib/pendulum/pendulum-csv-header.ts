import { RecordingInputError } from '../domain';
import { nextLine, unquote } from './csv-lines';

export type ColumnKind = 'time_s' | 'time_ms' | 'angle_deg' | 'angle_rad' | 'gyro_dps' | 'emg_uv';
const KNOWN_COLUMNS: readonly ColumnKind[] = ['time_s', 'time_ms', 'angle_deg', 'angle_rad', 'gyro_dps', 'emg_uv'];

/** The header row read: where the data starts, the delimiter, and each column's name and kind. */
export interface PendulumCsvHeader {
  /** Text offset and 1-based line number of the header (data follow it). */
  readonly pos: number;
  readonly line: number;
  readonly delimiter: string;
  readonly names: readonly string[];
  readonly kinds: readonly ColumnKind[];
}

/**
 * Step 1 of parsePendulumCsv: the first line that is neither blank nor a `#` comment is the header;
 * its delimiter is a comma, else a semicolon or a tab. Throws RecordingInputError (file, header line)
 * for an empty file, an unknown or duplicate column, both units of time or angle, no time, or neither
 * angle nor gyro.
 */
export function readPendulumCsvHeader(text: string, fileName: string): PendulumCsvHeader {
  let pos = 0;
  let line = 0;
  let header: string | null = null;
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
    break;
  }
  if (header === null) throw new RecordingInputError(fileName, null, 'empty file: no header row and no data rows');
  const refuse = (reason: string): never => {
    throw new RecordingInputError(fileName, line, reason);
  };
  const delimiter = header.includes(',') ? ',' : header.includes(';') ? ';' : header.includes('\t') ? '\t' : ',';
  const names = header.split(delimiter).map((n) => unquote(n.trim()).trim().toLowerCase());
  const kinds: ColumnKind[] = [];
  for (const name of names) {
    if (!(KNOWN_COLUMNS as readonly string[]).includes(name)) {
      refuse(`unknown column "${name}"; expected time_s or time_ms, angle_deg or angle_rad, optional gyro_dps and emg_uv`);
    }
    if (kinds.includes(name as ColumnKind)) refuse(`column "${name}" appears twice`);
    kinds.push(name as ColumnKind);
  }
  const has = (k: ColumnKind): boolean => kinds.includes(k);
  if (has('time_s') && has('time_ms')) refuse('both time_s and time_ms given; keep one');
  if (has('angle_deg') && has('angle_rad')) refuse('both angle_deg and angle_rad given; keep one');
  if (!has('time_s') && !has('time_ms')) refuse('missing time column (time_s or time_ms)');
  if (!has('angle_deg') && !has('angle_rad') && !has('gyro_dps')) refuse('missing angle column (angle_deg or angle_rad) and no gyro_dps to reconstruct it from');
  return { pos, line, delimiter, names, kinds };
}
