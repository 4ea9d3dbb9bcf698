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
  readReliabilityCsv,
  StatsInputError,
} from '../../lib/stats';

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
    let parsed: ReturnType<typeof readReliabilityCsv>;
    try {
      parsed = readReliabilityCsv(text, file);
    } catch (error) {
      if (error instanceof StatsInputError) throw new RefusedInput(error.message);
      throw error;
    }
    const { table, lines, columns } = parsed;
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
