import { roundTo as round } from '../stats';
import type { SeededRandom } from './seeded-random';

/**
 * A knee-angle trace for a leg-drop pendulum test, 12 s at 100 Hz: the step response of a damped
 * linear pendulum from full extension (0°) toward `restDeg`, with its damping ratio chosen so the
 * first swing overshoots by (ri − 1)·restDeg (the relaxation index A1/A0 = 1 + overshoot), period
 * about 1.1 s, and 0.3° noise. A demo signal, not a physiological model.
 */
export function demoPendulumTrace(ri: number, restDeg: number, rng: SeededRandom): Float64Array<ArrayBuffer> {
  const overshoot = ri - 1;
  const zeta = overshoot > 0.01 ? -Math.log(overshoot) / Math.sqrt(Math.PI ** 2 + Math.log(overshoot) ** 2) : 0.95;
  const omegaDamped = (2 * Math.PI) / 1.1;
  const omegaNatural = omegaDamped / Math.sqrt(Math.max(1e-6, 1 - zeta * zeta));
  const samples = new Float64Array(1200);
  for (let i = 0; i < samples.length; i++) {
    const t = i / 100;
    const decay = Math.exp(-zeta * omegaNatural * t);
    const shape = Math.cos(omegaDamped * t) + ((zeta * omegaNatural) / omegaDamped) * Math.sin(omegaDamped * t);
    samples[i] = round(restDeg - restDeg * decay * shape + rng.normal(0, 0.3), 3);
  }
  return samples;
}
