import { butterworthLowPass } from './butterworth-low-pass';
import { zeroPhaseFilter } from './zero-phase-filter';

/** High-pass corner that removes movement artefact and offset before rectifying (Hz). */
const EMG_HIGH_PASS_HZ = 20;
/** Low-pass corner that smooths the rectified signal into an envelope (Hz). */
const EMG_ENVELOPE_HZ = 6;

/**
 * Linear envelope of one raw EMG channel: remove the mean, high-pass at 20 Hz (2nd-order
 * Butterworth, forward-backward; skipped when the sampling rate is too low for it), full-wave
 * rectify, then low-pass at 6 Hz (2nd-order Butterworth, forward-backward) and clamp at 0.
 * The 20 Hz / 6 Hz corners are common practice for surface EMG envelopes (e.g. Winter,
 * Biomechanics and Motor Control of Human Movement, chapter on EMG; from memory).
 * Cost O(n); writes `out` and returns it. Units stay those of the input (µV).
 */
export function emgEnvelope(emgUv: Float64Array, sampleRateHz: number, out: Float64Array): Float64Array {
  const n = emgUv.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += emgUv[i];
  mean /= Math.max(n, 1);
  for (let i = 0; i < n; i++) out[i] = emgUv[i] - mean;
  if (EMG_HIGH_PASS_HZ < 0.45 * sampleRateHz) {
    // High-pass = signal − low-pass at the same corner (complementary zero-phase pair).
    const low = zeroPhaseFilter(butterworthLowPass(2, EMG_HIGH_PASS_HZ, sampleRateHz), out, new Float64Array(n), Math.ceil((3 * sampleRateHz) / EMG_HIGH_PASS_HZ));
    for (let i = 0; i < n; i++) out[i] -= low[i];
  }
  for (let i = 0; i < n; i++) out[i] = Math.abs(out[i]);
  const envelopeHz = Math.min(EMG_ENVELOPE_HZ, 0.4 * sampleRateHz);
  zeroPhaseFilter(butterworthLowPass(2, envelopeHz, sampleRateHz), out, out, Math.ceil((3 * sampleRateHz) / envelopeHz));
  for (let i = 0; i < n; i++) if (out[i] < 0) out[i] = 0;
  return out;
}
