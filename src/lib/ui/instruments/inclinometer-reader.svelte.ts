import { DeviceMotionSource, angleBetweenDeg, axisAngleToVerticalDeg, steadyReading, type MotionProblem, type SteadyReading } from '$lib/sensors';
import { INSTRUMENT_MESSAGES as m } from '../messages/instrument-messages';
import { startMotionInTap } from './motion-permission';

/**
 * The phone inclinometer as page state, by the two-position method: a steady reading in the start
 * position (zero), another in the end position; the joint angle is the turn of gravity between them.
 */
export class InclinometerReader {
  running = $state(false);
  problem = $state<MotionProblem | null>(null);
  problemDetail = $state('');
  reading = $state.raw<SteadyReading | null>(null);
  segmentDeg = $state<number | null>(null);
  zero = $state.raw<SteadyReading | null>(null);
  end = $state.raw<SteadyReading | null>(null);
  jointDeg = $state<number | null>(null);
  message = $state('');

  #source: DeviceMotionSource | null = null;
  #frame = 0;

  async start(): Promise<void> {
    if (!(await startMotionInTap(this))) return;
    const source = new DeviceMotionSource();
    this.#source = source;
    source.start({
      onSample: () => this.#scheduleFrame(),
      onProblem: (p) => {
        this.problem = p;
        this.running = false;
        source.stop();
      },
    });
    this.running = true;
  }

  setZero(): void {
    if (!this.reading?.steady) {
      this.message = m.notSteadyAtZero;
      return;
    }
    this.zero = this.reading;
    this.end = null;
    this.jointDeg = null;
    this.message = m.zeroSet;
  }

  setEnd(): void {
    const zero = this.zero;
    if (!zero) return;
    const r = this.reading;
    if (!r?.steady) {
      this.message = m.notSteadyAtEnd;
      return;
    }
    this.end = r;
    this.jointDeg = angleBetweenDeg(zero.meanX, zero.meanY, zero.meanZ, r.meanX, r.meanY, r.meanZ);
    this.message = m.angleMeasured;
  }

  dispose(): void {
    this.#source?.stop();
    if (this.#frame) cancelAnimationFrame(this.#frame);
  }

  #scheduleFrame(): void {
    if (this.#frame) return;
    this.#frame = requestAnimationFrame(() => {
      this.#frame = 0;
      if (!this.#source) return;
      const view = this.#source.buffer.view();
      const r = steadyReading(view, view.timeMs.length);
      this.reading = r;
      if (r.samples > 0) this.segmentDeg = axisAngleToVerticalDeg(r.meanX, r.meanY, r.meanZ, 'y');
    });
  }
}
