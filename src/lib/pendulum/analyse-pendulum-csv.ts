import { analysePendulumTrace, type PendulumOptions } from './analyse-pendulum-trace';
import { parsePendulumCsv, type PendulumTrace } from './parse-pendulum-csv';
import type { PendulumAnalysis } from './pendulum-result';

/** The analysis and the parsed raw columns (kept with the observations as the trace). */
export interface PendulumCsvResult {
  readonly analysis: PendulumAnalysis;
  readonly raw: PendulumTrace;
}

/**
 * Parses a pendulum recording from CSV text and analyses it: parsePendulumCsv followed by
 * analysePendulumTrace, with `fileName` in every refusal; the one parse-then-analyse of the command
 * and the Web Worker (and its main-thread fallback). Pure: no file system, so it runs in a worker on
 * text read from a File. Throws RecordingInputError (PendulumInputError: file, row, reason).
 *
 * @example
 * const { analysis, raw } = parseAndAnalysePendulumCsv(text, 'left-knee.csv');
 * analysis.indices.relaxationIndex; // e.g. 1.58; raw.lines names each sample's file line
 */
export function parseAndAnalysePendulumCsv(text: string, fileName: string, options: Omit<PendulumOptions, 'fileName'> = {}): PendulumCsvResult {
  const raw = parsePendulumCsv(text, fileName);
  return { analysis: analysePendulumTrace(raw, { ...options, fileName }), raw };
}

/** parseAndAnalysePendulumCsv without the raw columns (the command prints the indices only). */
export function analysePendulumCsv(text: string, fileName: string, options: Omit<PendulumOptions, 'fileName'> = {}): PendulumAnalysis {
  return parseAndAnalysePendulumCsv(text, fileName, options).analysis;
}
