import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseOptions, RefusedInput, type CliCommand } from '../command';
import {
  anovaMeanSquares,
  completeSubjects,
  intraclassCorrelations,
  mdcFromSem,
  MissingCellError,
  semFromMeanSquareError,
  type ReliabilityTable,
} from '../../lib/stats';

/** One CSV record with the 1-based line on which it starts. */
interface CsvRecord {
  readonly line: number;
  readonly fields: string[];
}

/**
 * Splits CSV text into records per RFC 4180: comma separators, fields optionally in double quotes
 * with "" for a quote, CRLF or LF line ends (also inside quotes), an optional UTF-8 byte-order mark.
 * Throws RefusedInput for an unterminated quote or text after a closing quote.
 */
export function parseCsv(text: string, file: string): CsvRecord[] {
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
        if (i >= text.length) throw new RefusedInput(`${file}: line ${quoteLine}: a quoted field is never closed`);
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
        throw new RefusedInput(`${file}: line ${line}: text after a closing quote`);
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
function readTable(text: string, file: string): { table: ReliabilityTable; lines: number[]; columns: string[] } {
  const records = parseCsv(text, file);
  const header = records[0];
  if (!header) throw new RefusedInput(`${file}: the file is empty; expected a header row`);
  const k = header.fields.length - 1;
  if (k < 2) {
    throw new RefusedInput(`${file}: line ${header.line}: the header names ${k} trial column(s); need a subject column and at least 2 trial or rater columns`);
  }
  const subjectIds: string[] = [];
  const lines: number[] = [];
  const rows = records.slice(1);
  const scores = new Float64Array(rows.length * k);
  rows.forEach((record, r) => {
    if (record.fields.length !== k + 1) {
      throw new RefusedInput(`${file}: line ${record.line}: ${record.fields.length} fields, the header has ${k + 1}`);
    }
    const id = (record.fields[0] as string).trim();
    if (id === '') throw new RefusedInput(`${file}: line ${record.line}: the subject column is empty`);
    subjectIds.push(id);
    lines.push(record.line);
    for (let j = 0; j < k; j++) {
      const cell = (record.fields[j + 1] as string).trim();
      if (cell === '') {
        scores[r * k + j] = Number.NaN;
        continue;
      }
      if (!numberPattern.test(cell)) {
        throw new RefusedInput(
          `${file}: line ${record.line}: subject "${id}", column "${(header.fields[j + 1] as string).trim()}": "${cell}" is not a number`,
        );
      }
      scores[r * k + j] = Number(cell);
    }
  });
  return { table: { subjectIds, trialCount: k, scores }, lines, columns: header.fields.map((f) => f.trim()) };
}

const roundTrip = (value: number): number | null => (Number.isFinite(value) ? value : null);

export const reliabilityCommand: CliCommand = {
  name: 'reliability',
  summary: 'ICCs (six forms, 95 % CIs), SEM and MDC from a subjects × trials CSV',
  usage: [
    'kinnote reliability TABLE.csv [--drop-incomplete]',
    '',
    'TABLE.csv: a header row naming the subject column first, then one column per trial or rater;',
    'one row per subject. An empty cell is a missing score: the subject is refused (exit 1) unless',
    '--drop-incomplete drops it with a warning on stderr and in "warnings".',
    '',
    'Prints one JSON object: n, k, msRows, msColumns, msError, msWithin, icc (Shrout & Fleiss forms',
    '"1,1" "2,1" "3,1" "1,k" "2,k" "3,k", each {value, ci95}), sem = √msError, mdc95 = 1.96·√2·sem,',
    'mdc90 = 1.645·√2·sem, warnings. Undefined values (e.g. a table with no variation) are null.',
    'Not a diagnostic device: decisions rest with licensed clinicians.',
  ].join('\n'),
  async run(args, io) {
    const { positional, switches } = parseOptions(args, [], ['drop-incomplete']);
    if (positional.length !== 1) throw new RefusedInput('expected exactly one TABLE.csv argument');
    const file = positional[0] as string;
    let text: string;
    try {
      text = await readFile(resolve(io.cwd, file), 'utf8');
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code ?? String(error);
      throw new RefusedInput(`${file}: cannot read the file (${code})`);
    }
    const { table, lines, columns } = readTable(text, file);
    let complete: ReturnType<typeof completeSubjects>;
    try {
      complete = completeSubjects(table, switches.has('drop-incomplete') ? 'drop' : 'refuse');
    } catch (error) {
      if (error instanceof MissingCellError) {
        throw new RefusedInput(
          `${file}: line ${lines[error.rowIndex]}: subject "${error.subjectId}" has no score for "${columns[error.trialIndex + 1]}" ` +
            `(column ${error.trialIndex + 2}); ` +
            'fill it or pass --drop-incomplete',
        );
      }
      throw error;
    }
    const warnings = complete.droppedRowIndices.map(
      (row) => `${file}: line ${lines[row]}: dropped subject "${table.subjectIds[row]}" (missing score)`,
    );
    const n = complete.table.subjectIds.length;
    if (n < 2) throw new RefusedInput(`${file}: ${n} complete subject(s); the ICC needs at least 2`);
    const ms = anovaMeanSquares(complete.table.scores, n, table.trialCount);
    const icc = intraclassCorrelations(ms, 0.95);
    const sem = semFromMeanSquareError(ms.msError);
    const forms = ['1,1', '2,1', '3,1', '1,k', '2,k', '3,k'] as const;
    const result = {
      n,
      k: ms.trialCount,
      msRows: ms.msRows,
      msColumns: ms.msColumns,
      msError: ms.msError,
      msWithin: ms.msWithin,
      icc: Object.fromEntries(
        forms.map((form) => [form, { value: roundTrip(icc[form].value), ci95: icc[form].ci.map(roundTrip) }]),
      ),
      sem,
      mdc95: mdcFromSem(sem, 95),
      mdc90: mdcFromSem(sem, 90),
      warnings,
    };
    for (const warning of warnings) io.stderr(`kinnote reliability: warning: ${warning}`);
    io.stdout(JSON.stringify(result, null, 2));
    return 0;
  },
};
