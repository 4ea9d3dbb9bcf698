// The thin browser edge of the sensors folder: listens to `devicemotion`, asks for permission where
// the browser wants it, and reports in plain states what went wrong. Samples go into a MotionBuffer
// (pure); nothing here computes angles.
import { MotionBuffer } from './signal';

/** Why a recording cannot start or stopped early, for a clear message. */
export type MotionProblem =
  | 'unsupported' // no DeviceMotionEvent at all (old browser, or not a secure context)
  | 'denied' // the person or the browser refused motion access
  | 'no-sensor' // events come without data, or never come (desktop computers)
  | 'background'; // the page went to the background while recording

export type PermissionOutcome = { ok: true } | { ok: false; problem: 'unsupported' | 'denied'; detail: string };

interface PermissionApi {
  requestPermission?: () => Promise<'granted' | 'denied' | 'default'>;
}

/** True when the browser has the devicemotion API at all. */
export function motionApiPresent(): boolean {
  return typeof window !== 'undefined' && 'DeviceMotionEvent' in window;
}

/**
 * Asks for motion access where the browser requires it (Safari on iOS exposes a static
 * DeviceMotionEvent.requestPermission that only works inside a user gesture, so call this first
 * thing in a click handler, before any await). Elsewhere access is implicit and this resolves ok.
 */
export async function requestMotionPermission(): Promise<PermissionOutcome> {
  if (!motionApiPresent()) return { ok: false, problem: 'unsupported', detail: 'this browser has no motion sensor interface' };
  const api = (window as unknown as { DeviceMotionEvent: PermissionApi }).DeviceMotionEvent;
  if (typeof api.requestPermission !== 'function') return { ok: true };
  try {
    const answer = await api.requestPermission();
    return answer === 'granted' ? { ok: true } : { ok: false, problem: 'denied', detail: `the browser answered "${answer}"` };
  } catch (error) {
    return { ok: false, problem: 'denied', detail: error instanceof Error ? error.message : String(error) };
  }
}

export interface MotionSourceCallbacks {
  /** Called for every accepted sample (after it is in the buffer). */
  readonly onSample?: (timeMs: number, alpha: number, beta: number, gamma: number, x: number, y: number, z: number) => void;
  /** Called once when no data arrives within `noDataTimeoutMs`, or the page goes to the background. */
  readonly onProblem?: (problem: MotionProblem) => void;
}

/**
 * Listens to devicemotion and appends complete samples (rotation rate and acceleration including
 * gravity both present) to `buffer`. Events with null fields are counted, not stored: browsers
 * without sensors send such events (or none at all). Reports 'no-sensor' when no complete sample
 * arrives within `noDataTimeoutMs`, and 'background' (then stops) when the page is hidden; the samples
 * already in the buffer stay.
 */
export class DeviceMotionSource {
  readonly buffer: MotionBuffer;
  emptyEvents = 0;
  #listening = false;
  #timer: ReturnType<typeof setTimeout> | null = null;
  #callbacks: MotionSourceCallbacks = {};

  constructor(buffer = new MotionBuffer(4096)) {
    this.buffer = buffer;
  }

  get listening(): boolean {
    return this.#listening;
  }

  start(callbacks: MotionSourceCallbacks = {}, noDataTimeoutMs = 1500): void {
    if (this.#listening) return;
    this.#callbacks = callbacks;
    this.#listening = true;
    window.addEventListener('devicemotion', this.#onMotion);
    document.addEventListener('visibilitychange', this.#onVisibility);
    const startLength = this.buffer.length;
    this.#timer = setTimeout(() => {
      if (this.#listening && this.buffer.length === startLength) this.#callbacks.onProblem?.('no-sensor');
    }, noDataTimeoutMs);
  }

  stop(): void {
    if (!this.#listening) return;
    this.#listening = false;
    window.removeEventListener('devicemotion', this.#onMotion);
    document.removeEventListener('visibilitychange', this.#onVisibility);
    if (this.#timer !== null) clearTimeout(this.#timer);
    this.#timer = null;
  }

  #onMotion = (event: DeviceMotionEvent): void => {
    const r = event.rotationRate;
    const a = event.accelerationIncludingGravity;
    if (!r || !a || r.alpha === null || r.beta === null || r.gamma === null || a.x === null || a.y === null || a.z === null) {
      this.emptyEvents++;
      return;
    }
    if (this.buffer.push(event.timeStamp, r.alpha, r.beta, r.gamma, a.x, a.y, a.z)) {
      this.#callbacks.onSample?.(event.timeStamp, r.alpha, r.beta, r.gamma, a.x, a.y, a.z);
    }
  };

  #onVisibility = (): void => {
    if (document.visibilityState === 'hidden') {
      this.stop();
      this.#callbacks.onProblem?.('background');
    }
  };
}

/** The message a person sees for each problem (kept here so both pages say the same). */
export function describeMotionProblem(problem: MotionProblem): string {
  switch (problem) {
    case 'unsupported':
      return 'This browser cannot read motion sensors. Use a phone or tablet browser, opened over a secure (https) address.';
    case 'denied':
      return 'Motion access was refused. Allow motion and orientation access for this site in the browser settings, then try again.';
    case 'no-sensor':
      return 'No motion sensor is sending data. This device may have no gyroscope (most desktop computers do not); use a phone or tablet.';
    case 'background':
      return 'The recording stopped because the page went to the background (screen locked or another app opened). What was recorded so far is kept.';
  }
}
