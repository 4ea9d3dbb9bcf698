/** What the live display shows after each sample. */
export interface LiveSwingState {
  /** Rotation from the starting orientation (deg, ≥ 0), by gyro integration. */
  readonly angleDeg: number;
  /** Whether the leg has swung yet (a rate above moveRateDps). */
  readonly moved: boolean;
  /** How long the leg has been at rest since it moved (s). */
  readonly restS: number;
  /** True once the leg has been at rest for restToStopS after moving. */
  readonly shouldStop: boolean;
}

/**
 * Live angle and automatic stop for a pendulum recording, one sample at a time.
 *
 * The angle is the magnitude of the rotation since the start, from integrating the bias-corrected
 * angular velocity into a unit quaternion (first-order exact step q ← q ⊗ exp(½ ω dt); e.g. Kuipers,
 * Quaternions and Rotation Sequences, from memory). It needs no knee axis, which is unknown until
 * the leg has swung; for a hinge starting at full extension it equals the knee flexion. It is for
 * display only: the saved angle comes from reconstructKneeAngle, which also uses gravity.
 *
 * Automatic stop: after a rate above moveRateDps (default 60 °/s), the leg counts as at rest while
 * |ω − bias| stays under restRateDps (default 5 °/s); after restToStopS (default 2 s) shouldStop is set.
 * O(1) per sample, no allocation.
 */
export class LiveSwingMonitor {
  #qw = 1;
  #qx = 0;
  #qy = 0;
  #qz = 0;
  #lastMs = Number.NaN;
  #moved = false;
  #restSinceMs = Number.NaN;
  #state: LiveSwingState = { angleDeg: 0, moved: false, restS: 0, shouldStop: false };

  constructor(
    /** Gyro bias on the device axes (x, y, z) in deg/s, e.g. the mean over the countdown. */
    readonly biasDps: readonly [number, number, number] = [0, 0, 0],
    readonly moveRateDps = 60,
    readonly restRateDps = 5,
    readonly restToStopS = 2,
  ) {}

  get state(): LiveSwingState {
    return this.#state;
  }

  /** Feeds one sample (time in ms; W3C rotationRate alpha, beta, gamma in deg/s). */
  push(timeMs: number, alphaDps: number, betaDps: number, gammaDps: number): LiveSwingState {
    // Current W3C text: alpha about x, beta about y, gamma about z (see MotionRecording).
    const wx = alphaDps - this.biasDps[0];
    const wy = betaDps - this.biasDps[1];
    const wz = gammaDps - this.biasDps[2];
    const rate = Math.hypot(wx, wy, wz);
    if (Number.isFinite(this.#lastMs) && timeMs > this.#lastMs) {
      const dt = (timeMs - this.#lastMs) / 1000;
      const half = 0.5 * rate * dt * (Math.PI / 180);
      if (half > 0) {
        const s = Math.sin(half) / rate;
        const dw = Math.cos(half);
        const dx = wx * s;
        const dy = wy * s;
        const dz = wz * s;
        const { w, x, y, z } = { w: this.#qw, x: this.#qx, y: this.#qy, z: this.#qz };
        this.#qw = w * dw - x * dx - y * dy - z * dz;
        this.#qx = w * dx + x * dw + y * dz - z * dy;
        this.#qy = w * dy - x * dz + y * dw + z * dx;
        this.#qz = w * dz + x * dy - y * dx + z * dw;
        const norm = Math.hypot(this.#qw, this.#qx, this.#qy, this.#qz);
        this.#qw /= norm;
        this.#qx /= norm;
        this.#qy /= norm;
        this.#qz /= norm;
      }
    }
    this.#lastMs = timeMs;
    if (rate > this.moveRateDps) this.#moved = true;
    if (this.#moved && rate < this.restRateDps) {
      if (!Number.isFinite(this.#restSinceMs)) this.#restSinceMs = timeMs;
    } else {
      this.#restSinceMs = Number.NaN;
    }
    const restS = Number.isFinite(this.#restSinceMs) ? (timeMs - this.#restSinceMs) / 1000 : 0;
    const angleDeg = 2 * Math.atan2(Math.hypot(this.#qx, this.#qy, this.#qz), Math.abs(this.#qw)) * (180 / Math.PI);
    this.#state = { angleDeg, moved: this.#moved, restS, shouldStop: this.#moved && restS >= this.restToStopS };
    return this.#state;
  }
}
