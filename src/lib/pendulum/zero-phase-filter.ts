/**
 * Filters `input` forward and then backward through the second-order sections `sos` (layout
 * b0 b1 b2 1 a1 a2 per section), giving zero phase shift and the squared magnitude response.
 *
 * Edges, as in the usual "filtfilt" scheme (Gustafsson 1996 discusses the choice of initial
 * states; the odd extension and steady-state start are common practice): the signal is extended at
 * both ends by `padLength` samples reflected through the end value (odd extension, which continues
 * the local slope), and every section starts in the steady state it would hold for a constant input
 * equal to the first padded value, so a constant or a ramp passes without a start-up transient.
 * Transposed direct form II.
 *
 * Cost: O(n · sections); allocates one scratch array of n + 2·padLength (outside the sample loop).
 * `out` may be `input`. Returns `out`. Throws RangeError when `out` is shorter than `input`.
 * An input of length 0 returns `out` untouched; shorter inputs shrink the padding to n − 1.
 */
export function zeroPhaseFilter(
  sos: Float64Array,
  input: Float64Array,
  out: Float64Array,
  padLength: number = defaultPadLength(sos),
): Float64Array {
  const n = input.length;
  if (out.length < n) throw new RangeError(`zeroPhaseFilter: out has ${out.length} samples, input ${n}`);
  if (n === 0) return out;
  const pad = Math.max(0, Math.min(padLength, n - 1));
  const m = n + 2 * pad;
  const work = new Float64Array(m);
  const first = input[0];
  const last = input[n - 1];
  for (let i = 0; i < pad; i++) {
    work[i] = 2 * first - input[pad - i];
    work[pad + n + i] = 2 * last - input[n - 2 - i];
  }
  work.set(input, pad);
  const sections = sos.length / 6;
  const state = new Float64Array(sections * 2);

  steadyState(sos, work[0], state);
  runSections(sos, work, 0, m, 1, state);
  steadyState(sos, work[m - 1], state);
  runSections(sos, work, m - 1, -1, -1, state);

  for (let i = 0; i < n; i++) out[i] = work[pad + i];
  return out;
}

/** Three times the number of filter coefficients per side, as scipy's sosfiltfilt does by default. */
function defaultPadLength(sos: Float64Array): number {
  const sections = sos.length / 6;
  let trailingZeros = 0;
  for (let s = 0; s < sections; s++) if (sos[s * 6 + 2] === 0 && sos[s * 6 + 5] === 0) trailingZeros++;
  return 3 * (2 * sections + 1 - trailingZeros);
}

/** Section states for a constant input `level` (each section fed the DC output of the previous one). */
function steadyState(sos: Float64Array, level: number, state: Float64Array): void {
  let x = level;
  for (let s = 0; s < sos.length / 6; s++) {
    const o = s * 6;
    const b0 = sos[o];
    const b1 = sos[o + 1];
    const b2 = sos[o + 2];
    const a1 = sos[o + 4];
    const a2 = sos[o + 5];
    const y = (x * (b0 + b1 + b2)) / (1 + a1 + a2);
    state[s * 2] = y - b0 * x;
    state[s * 2 + 1] = b2 * x - a2 * y;
    x = y;
  }
}

function runSections(sos: Float64Array, data: Float64Array, start: number, stop: number, step: number, state: Float64Array): void {
  const sections = sos.length / 6;
  for (let s = 0; s < sections; s++) {
    const o = s * 6;
    const b0 = sos[o];
    const b1 = sos[o + 1];
    const b2 = sos[o + 2];
    const a1 = sos[o + 4];
    const a2 = sos[o + 5];
    let z1 = state[s * 2];
    let z2 = state[s * 2 + 1];
    for (let i = start; i !== stop; i += step) {
      const x = data[i];
      const y = b0 * x + z1;
      z1 = b1 * x - a1 * y + z2;
      z2 = b2 * x - a2 * y;
      data[i] = y;
    }
  }
}
