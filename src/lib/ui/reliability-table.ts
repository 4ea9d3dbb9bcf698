import type { ReliabilityStudy } from '$lib/domain';
import {
  anovaMeanSquares,
  completeSubjects,
  intraclassCorrelations,
  mdcFromSem,
  semFromMeanSquareError,
  type IntraclassCorrelations,
  type ReliabilityTable,
} from '$lib/stats';

/** A study's trials as a subjects × columns table; a column is one (rater, trial) pair. */
export function studyTable(study: Pick<ReliabilityStudy, 'trials'>): ReliabilityTable & { columns: Array<{ raterIndex: number; trial: number }> } {
  const columnKeys = [...new Set(study.trials.map((t) => `${t.raterIndex}:${t.trial}`))]
    .map((key) => key.split(':').map(Number) as [number, number])
    .sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const subjects = [...new Set(study.trials.map((t) => t.subjectLabel))];
  const k = columnKeys.length;
  const scores = new Float64Array(subjects.length * k).fill(Number.NaN);
  for (const t of study.trials) {
    const i = subjects.indexOf(t.subjectLabel);
    const j = columnKeys.findIndex(([r, trial]) => r === t.raterIndex && trial === t.trial);
    scores[i * k + j] = t.value;
  }
  return { subjectIds: subjects, trialCount: k, scores, columns: columnKeys.map(([raterIndex, trial]) => ({ raterIndex, trial })) };
}

export interface ReliabilityResult {
  readonly n: number;
  readonly k: number;
  readonly icc: IntraclassCorrelations;
  readonly msError: number;
  readonly sem: number;
  readonly mdc95: number;
  readonly mdc90: number;
  readonly warnings: readonly string[];
}

/**
 * ICC forms, SEM = √MS error (Weir 2005) and MDC95/90 for a table; incomplete subjects are dropped with
 * a warning. Returns null with a reason when fewer than two complete subjects or columns remain.
 */
export function reliabilityResult(table: ReliabilityTable): ReliabilityResult | { error: string } {
  if (table.trialCount < 2) return { error: 'Needs at least two trials or raters per subject.' };
  const complete = completeSubjects(table, 'drop');
  const n = complete.table.subjectIds.length;
  if (n < 2) return { error: `Needs at least two subjects with every score filled in (now ${n}).` };
  const ms = anovaMeanSquares(complete.table.scores, n, table.trialCount);
  const sem = semFromMeanSquareError(ms.msError);
  return {
    n,
    k: table.trialCount,
    icc: intraclassCorrelations(ms, 0.95),
    msError: ms.msError,
    sem,
    mdc95: mdcFromSem(sem, 95),
    mdc90: mdcFromSem(sem, 90),
    warnings: complete.warnings,
  };
}

/** The single-measure absolute-agreement form fits an MDC for one clinic measurement (see the page). */
export const ADOPTED_ICC_FORM = '2,1' as const;
