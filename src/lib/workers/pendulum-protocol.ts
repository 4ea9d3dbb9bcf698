import type { PendulumAnalysis } from '$lib/pendulum';

/** Messages between the page and the pendulum worker. */
export interface PendulumRequest {
  readonly id: number;
  readonly csvText: string;
  readonly fileName: string;
}

export type PendulumReply =
  | { readonly id: number; readonly ok: true; readonly analysis: PendulumAnalysis }
  | { readonly id: number; readonly ok: false; readonly message: string; readonly refused: boolean };
