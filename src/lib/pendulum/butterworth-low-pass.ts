/**
 * Designs a digital Butterworth low-pass filter as second-order sections.
 *
 * Method: analogue Butterworth prototype (poles evenly spaced on the left half of the unit circle),
 * frequency pre-warping K = tan(π·fc/fs) and the bilinear transform s → (1 − z⁻¹)/(1 + z⁻¹)·(1/K),
 * one biquad per conjugate pole pair plus one first-order section for odd orders (Oppenheim &
 * Schafer, Discrete-Time Signal Processing, bilinear-transform IIR design; from memory). Each section
 * has unit gain at 0 Hz, so the cascade passes a constant unchanged. Magnitude response:
 * |H|² = 1 / (1 + (tan(πf/fs) / tan(πfc/fs))^(2·order)).
 *
 * Layout matches the common "sos" convention: for each section six numbers b0 b1 b2 a0 a1 a2 with
 * a0 = 1. Throws RangeError for order < 1 or a cut-off outside (0, fs/2).
 */
export function butterworthLowPass(order: number, cutoffHz: number, sampleRateHz: number): Float64Array {
  if (!Number.isInteger(order) || order < 1) throw new RangeError(`Butterworth order must be a whole number ≥ 1, got ${order}`);
  if (!(cutoffHz > 0 && cutoffHz < sampleRateHz / 2)) {
    throw new RangeError(`Butterworth cut-off ${cutoffHz} Hz must lie between 0 and half the sampling rate (${sampleRateHz / 2} Hz)`);
  }
  const k = Math.tan((Math.PI * cutoffHz) / sampleRateHz);
  const k2 = k * k;
  const pairs = order >> 1;
  const sections = pairs + (order % 2);
  const sos = new Float64Array(sections * 6);
  for (let p = 0; p < pairs; p++) {
    // Analogue pole pair −ζ ± j√(1−ζ²) on the unit circle, ζ = sin((2p+1)π / (2·order)).
    const zeta = Math.sin(((2 * p + 1) * Math.PI) / (2 * order));
    const d = 1 + 2 * zeta * k + k2;
    const o = p * 6;
    sos[o] = k2 / d;
    sos[o + 1] = (2 * k2) / d;
    sos[o + 2] = k2 / d;
    sos[o + 3] = 1;
    sos[o + 4] = (2 * (k2 - 1)) / d;
    sos[o + 5] = (1 - 2 * zeta * k + k2) / d;
  }
  if (order % 2 === 1) {
    // Real pole at −1: H(s) = 1/(s + 1) → first-order section.
    const o = pairs * 6;
    sos[o] = k / (1 + k);
    sos[o + 1] = k / (1 + k);
    sos[o + 2] = 0;
    sos[o + 3] = 1;
    sos[o + 4] = (k - 1) / (k + 1);
    sos[o + 5] = 0;
  }
  return sos;
}
