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
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
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

const numberPattern = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Reads the subjects × trials table: header first, subject column first, empty cell = missing. */
export function readReliabilityCsv(text: string, file: string): { table: ReliabilityTable; lines: number[]; columns: string[] } {
  const records = parseCsvRecords(text, file);
  const header = records[0];
  if (!header) throw new StatsInputError(`${file}: the file is empty; expected a header row`);
  const k = header.fields.length - 1;
  if (k < 2) {
    throw new StatsInputError(`${file}: line ${header.line}: the header names ${k} trial column(s); need a subject column and at least 2 trial or rater columns`);
  }
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
    subjectIds.push(id);
    lines.push(record.line);
    for (let j = 0; j < k; j++) {
      const cell = (record.fields[j + 1] as string).trim();
      if (cell === '') {
        scores[r * k + j] = Number.NaN;
        continue;
      }
      if (!numberPattern.test(cell)) {
        throw new StatsInputError(
          `${file}: line ${record.line}: subject "${id}", column "${(header.fields[j + 1] as string).trim()}": "${cell}" is not a number`,
        );
      }
      scores[r * k + j] = Number(cell);
    }
  });
  return { table: { subjectIds, trialCount: k, scores }, lines, columns: header.fields.map((f) => f.trim()) };
}

