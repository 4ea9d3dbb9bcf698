import { readDecimal, withoutByteOrderMark } from '../domain';
import type { ReliabilityTable } from './complete-subjects';
import { StatsInputError } from './stats-input-error';

/** One CSV record with the 1-based line on which it starts. */
export interface CsvRecord {
  readonly line: number;
  readonly fields: string[];
}

/**
 * Splits CSV text into records per RFC 4180: comma separators, fields optionally in double quotes
 * with "" for a quote, CRLF or LF line ends (also inside quotes), an optional UTF-8 byte-order mark.
 * Throws StatsInputError for an unterminated quote or text after a closing quote.
 */
export function parseCsvRecords(text: string, file: string): CsvRecord[] {
  const records: CsvRecord[] = [];
  text = withoutByteOrderMark(text);
  let i = 0;
  let line = 1;
  let fields: string[] = [];
  let field = '';
  let recordLine = 1;
  let atFieldStart = true;
  const endRecord = (): void => {
    fields.push(field);
    records.push({ line: recordLine, fields });
    fields = [];
    field = '';
    atFieldStart = true;
  };
  while (i < text.length) {
    const ch = text[i] as string;
    if (atFieldStart && ch === '"') {
      const quoteLine = line;
      i++;
      for (;;) {
        if (i >= text.length) throw new StatsInputError(`${file}: line ${quoteLine}: a quoted field is never closed`);
        const c = text[i] as string;
        if (c === '"') {
          if (text[i + 1] === '"') {
            field += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        if (c === '\n') line++;
        field += c;
        i++;
      }
      const next = text[i];
      if (next !== undefined && next !== ',' && next !== '\n' && next !== '\r') {
        throw new StatsInputError(`${file}: line ${line}: text after a closing quote`);
      }
      atFieldStart = false;
      continue;
    }
    if (ch === ',') {
      fields.push(field);
      field = '';
      atFieldStart = true;
      i++;
    } else if (ch === '\r' || ch === '\n') {
      endRecord();
      i += ch === '\r' && text[i + 1] === '\n' ? 2 : 1;
      line++;
      recordLine = line;
    } else {
      field += ch;
      atFieldStart = false;
      i++;
    }
  }
  if (!atFieldStart || field !== '' || fields.length > 0) endRecord();
  // Entirely blank lines (one empty field) carry no record.
  return records.filter((r) => !(r.fields.length === 1 && (r.fields[0] as string).trim() === ''));
}

/**
 * Reads the subjects × trials table: header first, subject column first, empty cell = missing.
 * Throws StatsInputError (file, line, reason) for a first row whose trial columns are all numbers
 * (no header: the first subject would be taken as one), a subject id that appears twice (it would
 * count as two subjects), a row of the wrong width, and a score that is not a finite decimal
 * (readDecimal: hexadecimal and overflow such as 1e400 are refused).
 */
export function readReliabilityCsv(text: string, file: string): { table: ReliabilityTable; lines: number[]; columns: string[] } {
  const records = parseCsvRecords(text, file);
  const header = records[0];
  if (!header) throw new StatsInputError(`${file}: the file is empty; expected a header row`);
  const k = header.fields.length - 1;
  if (k < 2) {
    throw new StatsInputError(`${file}: line ${header.line}: the header names ${k} trial column(s); need a subject column and at least 2 trial or rater columns`);
  }
  const headerTrials = header.fields.slice(1).map((f) => f.trim());
  if (headerTrials.every((f) => f !== '' && readDecimal(f).ok)) {
    throw new StatsInputError(
      `${file}: line ${header.line}: the first row holds numbers where the header should name the trials (${headerTrials.slice(0, 3).join(', ')}); add a header row like subject,trial1,trial2`,
    );
  }
  const firstLineOf = new Map<string, number>();
  const subjectIds: string[] = [];
  const lines: number[] = [];
  const rows = records.slice(1);
  const scores = new Float64Array(rows.length * k);
  rows.forEach((record, r) => {
    if (record.fields.length !== k + 1) {
      throw new StatsInputError(`${file}: line ${record.line}: ${record.fields.length} fields, the header has ${k + 1}`);
    }
    const id = (record.fields[0] as string).trim();
    if (id === '') throw new StatsInputError(`${file}: line ${record.line}: the subject column is empty`);
    const earlier = firstLineOf.get(id);
    if (earlier !== undefined) {
      throw new StatsInputError(`${file}: line ${record.line}: subject "${id.slice(0, 40)}" appears again (first on line ${earlier}); give each subject one row with all its trials`);
    }
    firstLineOf.set(id, record.line);
    subjectIds.push(id);
    lines.push(record.line);
    for (let j = 0; j < k; j++) {
      const cell = (record.fields[j + 1] as string).trim();
      if (cell === '') {
        scores[r * k + j] = Number.NaN;
        continue;
      }
      const reading = readDecimal(cell);
      if (!reading.ok) {
        throw new StatsInputError(
          `${file}: line ${record.line}: subject "${id}", column "${(header.fields[j + 1] as string).trim()}": "${cell.slice(0, 40)}" is not a finite decimal number (${reading.reason})`,
        );
      }
      scores[r * k + j] = reading.value;
    }
  });
  return { table: { subjectIds, trialCount: k, scores }, lines, columns: header.fields.map((f) => f.trim()) };
}

