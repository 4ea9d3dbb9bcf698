import type { PendulumAnalysis } from '$lib/pendulum';
import {
  DeviceMotionSource,
  LiveSwingMonitor,
  analyseMotionRecording,
  steadyReading,
  type KneeAngleReconstruction,
  type MotionProblem,
  type MotionRecording,
} from '$lib/sensors';
import { INSTRUMENT_MESSAGES as m } from '../messages/instrument-messages';
import { startMotionInTap } from './motion-permission';

const COUNTDOWN_S = 3;
const MAX_RECORDING_S = 60;

/**
 * The phone pendulum recording as page state: permission inside the tap, a countdown with the leg held
 * still (its mean rotation rate is the gyro's bias), recording until the leg has hung still (or 60 s),
 * then the analysis. One per page or visit panel; `dispose()` when it goes away.
 */
export class PhoneSwingRecorder {
  phase = $state<'ready' | 'countdown' | 'recording' | 'done'>('ready');
  countdown = $state(COUNTDOWN_S);
  liveAngle = $state(0);
  sampleCount = $state(0);
  problem = $state<MotionProblem | null>(null);
  problemDetail = $state('');
  analysis = $state.raw<PendulumAnalysis | null>(null);
  reconstruction = $state.raw<KneeAngleReconstruction | null>(null);
  recording = $state.raw<MotionRecording | null>(null);
  analysisError = $state<string | null>(null);
  startedAtMs = Date.now();

  #source: DeviceMotionSource | null = null;
  #monitor: LiveSwingMonitor | null = null;
  #timers: ReturnType<typeof setTimeout>[] = [];
  #frame = 0;

  async start(): Promise<void> {
    if (!(await startMotionInTap(this))) return;
    this.analysis = null;
    this.reconstruction = null;
    this.recording = null;
    this.analysisError = null;
    this.startedAtMs = Date.now();
    const source = new DeviceMotionSource();
    this.#source = source;
    this.#monitor = null;
    this.sampleCount = 0;
    this.liveAngle = 0;
    this.phase = 'countdown';
    this.countdown = COUNTDOWN_S;
    source.start({
      onSample: (t, alpha, beta, gamma) => {
        if (this.phase === 'recording' && this.#monitor) {
          if (this.#monitor.push(t, alpha, beta, gamma).shouldStop) this.stop();
        }
        this.#scheduleFrame();
      },
      onProblem: (p) => {
        this.problem = p;
        if (this.phase === 'countdown' || this.phase === 'recording') this.#finish();
      },
    });
    for (let s = 1; s <= COUNTDOWN_S; s++) {
      this.#timers.push(
        setTimeout(() => {
          this.countdown = COUNTDOWN_S - s;
          if (s === COUNTDOWN_S) this.#beginRecording();
        }, s * 1000),
      );
    }
  }

  stop(): void {
    if (this.phase === 'countdown' || this.phase === 'recording') this.#finish();
  }

  dispose(): void {
    this.#clearTimers();
    this.#source?.stop();
    if (this.#frame) cancelAnimationFrame(this.#frame);
  }

  #beginRecording(): void {
    const source = this.#source;
    if (!source || this.phase !== 'countdown') return;
    // The leg is held still during the countdown: its mean rotation rate is the gyro's bias.
    const view = source.buffer.view();
    const still = steadyReading(view, view.timeMs.length, { windowMs: 1000, maxRateDps: 8, maxSpreadDeg: 5 });
    let bias: [number, number, number] = [0, 0, 0];
    if (still.steady) {
      const n = view.timeMs.length;
      let bx = 0;
      let by = 0;
      let bz = 0;
      let count = 0;
      for (let i = n - 1; i >= 0 && view.timeMs[n - 1] - view.timeMs[i] <= 1000; i--, count++) {
        // Current W3C text: alpha about x, beta about y, gamma about z.
        bx += view.rateAlphaDps[i];
        by += view.rateBetaDps[i];
        bz += view.rateGammaDps[i];
      }
      bias = [bx / count, by / count, bz / count];
    }
    this.#monitor = new LiveSwingMonitor(bias);
    this.phase = 'recording';
    this.#timers.push(setTimeout(() => this.stop(), MAX_RECORDING_S * 1000));
  }

  #scheduleFrame(): void {
    if (this.#frame) return;
    this.#frame = requestAnimationFrame(() => {
      this.#frame = 0;
      if (this.#monitor) this.liveAngle = this.#monitor.state.angleDeg;
      this.sampleCount = this.#source?.buffer.length ?? 0;
    });
  }

  #clearTimers(): void {
    for (const t of this.#timers) clearTimeout(t);
    this.#timers = [];
  }

  #finish(): void {
    this.#clearTimers();
    this.#source?.stop();
    this.phase = 'done';
    const snapshot = this.#source ? this.#source.buffer.snapshot() : null;
    this.recording = snapshot && snapshot.timeMs.length > 0 ? snapshot : null;
    this.sampleCount = snapshot?.timeMs.length ?? 0;
    if (!this.recording) return;
    try {
      // A few thousand samples: the engine runs in well under 100 ms on the page.
      const result = analyseMotionRecording(this.recording, { fileName: m.thisRecording });
      this.analysis = result.analysis;
      this.reconstruction = result.reconstruction;
    } catch (error) {
      this.analysisError = error instanceof Error ? error.message : String(error);
    }
  }
}
