/**
 * The indices of one pendulum recording, as the `kinnote pendulum` command prints them.
 * Angles are knee flexion (0 = full extension, positive as the knee bends), in degrees; times in
 * seconds. A number that cannot be measured in this recording is null (never a guess).
 */
export interface PendulumIndices {
  /** Release instant: end of the hold at the starting angle, in the file's own time base (s). */
  readonly releaseTimeS: number;
  /** Starting angle: where the leg was held before release. */
  readonly startAngleDeg: number;
  /** Resting angle: mean of the final plateau, once a stability test says the leg is at rest. */
  readonly restAngleDeg: number;
  /** First flexion maximum after release: where the first downswing turns back. */
  readonly firstPeakDeg: number;
  /** Time of that maximum, counted from the release (s). */
  readonly firstPeakTimeS: number;
  /** A0 = resting − starting angle: how far gravity would take the leg if it just settled. */
  readonly a0Deg: number;
  /** A1 = first flexion peak − starting angle: how far the first swing actually went. */
  readonly a1Deg: number;
  /** Relaxation index R2 = A1/A0 (Bajd & Vodovnik 1984); about 1.6 in relaxed legs, lower when caught. */
  readonly relaxationIndex: number;
  /** R2/1.6, so that about 1 is typical of a relaxed leg. */
  readonly normalizedRelaxationIndex: number;
  /** Number of flexion peaks that pass the resting angle by more than 1 degree. */
  readonly peakCount: number;
  /** Time between the first two flexion peaks (s); null when the second does not pass rest by > 1°. */
  readonly firstPeriodS: number | null;
  /** Fastest flexion (knee bending) speed during the first downswing (deg/s). */
  readonly peakFlexionVelocityDps: number;
  /** Area between the curve and the resting line on the flexion side, release to rest (deg·s). */
  readonly flexionAreaDegS: number;
  /** Same on the extension side (deg·s, positive). */
  readonly extensionAreaDegS: number;
  /** Side holding more area: "flexion" (leg pulled into flexion), "extension" (leg held out), or "balanced". */
  readonly dominantSide: 'flexion' | 'extension' | 'balanced';
  /** Damped-cosine fit; numbers are null when the fit did not converge. */
  readonly fit: PendulumFitIndices;
  /** EMG summary, or null when the file has no EMG. */
  readonly emg: PendulumEmgIndices | null;
  /** Uniform rate the recording was resampled to (Hz). */
  readonly sampleRateHz: number;
  /** Time from release until the leg was judged at rest (s). */
  readonly restOnsetS: number;
  /** Where the angle came from: the angle column, or integrated gyro. */
  readonly angleSource: 'angle' | 'gyro';
  /** What looks unusual, in plain words. Never empty of a caution when R2 alone would mislead. */
  readonly warnings: string[];
}

/** θ(t) = θrest + A·e^(−t/τ)·cos(ωt + φ), t from release. */
export interface PendulumFitIndices {
  readonly amplitudeDeg: number | null;
  readonly tauS: number | null;
  readonly omegaRadS: number | null;
  readonly r2: number | null;
  readonly converged: boolean;
  /** Phase φ (rad) and the fitted resting angle θrest (deg), so the curve can be drawn. */
  readonly phaseRad: number | null;
  readonly restDeg: number | null;
}

/** One EMG burst: envelope above threshold long enough to count. Times from release (s). */
export interface PendulumEmgBurst {
  readonly onsetS: number;
  readonly offsetS: number;
  readonly peakUv: number;
  /** Swing phase of the onset: "flexion 1", "extension 1", "flexion 2", …, or "rest". */
  readonly phase: string;
}

export interface PendulumEmgPhase {
  readonly phase: string;
  readonly startS: number;
  readonly endS: number;
  readonly burstCount: number;
}

export interface PendulumEmgIndices {
  /**
   * Robust centre and spread of the envelope over the silent stretches (the second before release and
   * the rest plateau, µV): median, and 1.4826 × median absolute deviation (the SD for normal data).
   */
  readonly baselineMeanUv: number;
  readonly baselineSdUv: number;
  /** Burst-on threshold = centre + k·spread (a burst is kept while it stays above centre + k/2·spread). */
  readonly thresholdUv: number;
  readonly thresholdK: number;
  readonly bursts: PendulumEmgBurst[];
  readonly phases: PendulumEmgPhase[];
}

/** Processed signals and event positions, for charts (uniform grid: t = startS + i / sampleRateHz). */
export interface PendulumSignals {
  readonly startS: number;
  readonly sampleRateHz: number;
  /** Filtered knee angle (deg). */
  readonly angleDeg: Float64Array;
  /** Knee angular velocity (deg/s), positive in flexion. */
  readonly velocityDps: Float64Array;
  readonly emgEnvelopeUv: Float64Array | null;
  /** Release as a fractional sample index. */
  readonly releaseIndex: number;
  readonly firstPeakIndex: number;
  readonly restOnsetIndex: number;
  readonly restEndIndex: number;
  readonly flexionPeakIndices: Int32Array;
  readonly extensionPeakIndices: Int32Array;
}

export interface PendulumAnalysis {
  readonly indices: PendulumIndices;
  readonly signals: PendulumSignals;
}
