import type { PendulumCsvResult } from '$lib/pendulum';

/** Messages between the page and the pendulum worker. */
export interface PendulumRequest {
  readonly id: number;
  readonly csvText: string;
  readonly fileName: string;
}

/** The analysis and the parsed raw columns (kept with the observations as the trace). */
export type PendulumResult = PendulumCsvResult;

export type PendulumReply =
  | ({ readonly id: number; readonly ok: true } & PendulumResult)
  | { readonly id: number; readonly ok: false; readonly message: string; readonly refused: boolean };
