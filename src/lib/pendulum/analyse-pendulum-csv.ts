import { analysePendulumTrace, type PendulumOptions } from './analyse-pendulum-trace';
import { parsePendulumCsv } from './parse-pendulum-csv';
import type { PendulumAnalysis } from './pendulum-result';

/**
 * Parses a pendulum recording from CSV text and analyses it: parsePendulumCsv followed by
 * analysePendulumTrace, with `fileName` in every refusal. Pure: no file system, so it runs in a
 * Web Worker on text read from a File. Throws PendulumInputError (file, row, reason).
 */
export function analysePendulumCsv(text: string, fileName: string, options: Omit<PendulumOptions, 'fileName'> = {}): PendulumAnalysis {
  const trace = parsePendulumCsv(text, fileName);
  return analysePendulumTrace(trace, { ...options, fileName });
}
