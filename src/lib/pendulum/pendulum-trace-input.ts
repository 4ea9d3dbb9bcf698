/** A recording as typed columns (seconds, degrees, deg/s, µV), e.g. from parsePendulumCsv. */
export interface PendulumTraceInput {
  readonly timeS: Float64Array;
  readonly angleDeg?: Float64Array | null;
  readonly gyroDps?: Float64Array | null;
  readonly emgUv?: Float64Array | null;
  /** File line of each sample, for messages; defaults to index + 2 (header on line 1). */
  readonly lines?: Int32Array;
}

export interface PendulumOptions {
  /** Name used in refusal messages. */
  readonly fileName?: string;
  /** Gyro-only input: the angle at which the leg was held before release (default 0 = full extension). */
  readonly gyroStartAngleDeg?: number;
  /** EMG burst-on threshold k in median + k·robust SD of the silent baseline (default 3); see emg-summary.ts. */
  readonly emgThresholdK?: number;
}
