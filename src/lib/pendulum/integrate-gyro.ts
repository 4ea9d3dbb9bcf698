/**
 * Integrates an angular-velocity signal (deg/s) into an angle (deg) by the trapezoidal rule after
 * removing a bias that varies linearly in time: bias(i) = biasA at sample anchorA, biasB at anchorB,
 * straight line between, held constant outside. With one still period only, pass the same bias
 * twice. The integral starts at `initialDeg` at sample 0.
 *
 * Why linear: a MEMS gyroscope's bias drifts slowly with temperature; two still periods (before
 * release, after rest) pin it at both ends of the swing (common practice). O(n), writes `out`.
 */
export function integrateGyro(
  gyroDps: Float64Array,
  sampleRateHz: number,
  biasA: number,
  anchorA: number,
  biasB: number,
  anchorB: number,
  initialDeg: number,
  out: Float64Array,
): Float64Array {
  const n = gyroDps.length;
  if (n === 0) return out;
  const span = anchorB - anchorA;
  const biasAt = (i: number): number => {
    if (span <= 0 || i <= anchorA) return biasA;
    if (i >= anchorB) return biasB;
    return biasA + ((biasB - biasA) * (i - anchorA)) / span;
  };
  const halfStep = 0.5 / sampleRateHz;
  let previous = gyroDps[0] - biasAt(0);
  let angle = initialDeg;
  // Neumaier-compensated running sum: thousands of small increments.
  let compensation = 0;
  out[0] = angle;
  for (let i = 1; i < n; i++) {
    const current = gyroDps[i] - biasAt(i);
    const increment = (previous + current) * halfStep;
    const t = angle + increment;
    compensation += Math.abs(angle) >= Math.abs(increment) ? angle - t + increment : increment - t + angle;
    angle = t;
    out[i] = angle + compensation;
    previous = current;
  }
  return out;
}
