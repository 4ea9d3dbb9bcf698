import { StatsInputError } from './stats-input-error';

/** A subjects × trials table as read: one id per subject, row-major scores, NaN for a missing cell. */
export interface ReliabilityTable {
  readonly subjectIds: readonly string[];
  readonly trialCount: number;
  readonly scores: Float64Array;
}

/** A missing cell under the 'refuse' policy; carries where it is so a caller can name the row. */
export class MissingCellError extends StatsInputError {
  constructor(
    readonly rowIndex: number,
    readonly subjectId: string,
    readonly trialIndex: number,
  ) {
    super(`subject "${subjectId}" (row ${rowIndex + 1}) has no score for trial ${trialIndex + 1}`);
  }
}

/**
 * Keeps the subjects with a score in every trial. Policy 'refuse' throws MissingCellError at the
 * first missing (NaN) cell; 'drop' removes incomplete subjects and returns one warning per subject
 * dropped (listwise deletion, as the ICC models need a complete table). Cost O(n·k).
 * Throws StatsInputError when the shape is wrong.
 */
export function completeSubjects(
  table: ReliabilityTable,
  policy: 'refuse' | 'drop',
): { table: ReliabilityTable; warnings: string[]; droppedRowIndices: number[] } {
  const n = table.subjectIds.length;
  const k = table.trialCount;
  if (table.scores.length !== n * k) {
    throw new StatsInputError(`completeSubjects: ${table.scores.length} scores do not fill ${n} subjects × ${k} trials`);
  }
  const keep: number[] = [];
  const warnings: string[] = [];
  const dropped: number[] = [];
  for (let i = 0; i < n; i++) {
    let missing = -1;
    for (let j = 0; j < k; j++) {
      if (Number.isNaN(table.scores[i * k + j] as number)) {
        missing = j;
        break;
      }
    }
    if (missing < 0) {
      keep.push(i);
      continue;
    }
    const id = table.subjectIds[i] as string;
    if (policy === 'refuse') throw new MissingCellError(i, id, missing);
    dropped.push(i);
    warnings.push(`dropped subject "${id}" (row ${i + 1}): no score for trial ${missing + 1}`);
  }
  if (dropped.length === 0) return { table, warnings, droppedRowIndices: dropped };
  const scores = new Float64Array(keep.length * k);
  keep.forEach((row, index) => scores.set(table.scores.subarray(row * k, row * k + k), index * k));
  return {
    table: { subjectIds: keep.map((row) => table.subjectIds[row] as string), trialCount: k, scores },
    warnings,
    droppedRowIndices: dropped,
  };
}
