import { afterEach, describe, expect, it } from 'vitest';
import { startMotionInTap, type MotionProblemHolder } from '../../../src/lib/ui/instruments/motion-permission';

// The one motion-permission start of the inclinometer and the phone swing recorder. The browser is
// stood in for by a window whose DeviceMotionEvent answers like iOS Safari's requestPermission
// (W3C DeviceOrientation Event spec: requestPermission resolves "granted" or "denied").
const globals = globalThis as { window?: unknown };
afterEach(() => {
  delete globals.window;
});
function browserAnswering(answer: () => Promise<string>): void {
  globals.window = { DeviceMotionEvent: Object.assign(function DeviceMotionEvent() {}, { requestPermission: answer }) };
}

describe('startMotionInTap', () => {
  it('names the refusal on the holder and says no', async () => {
    browserAnswering(async () => 'denied');
    const holder: MotionProblemHolder = { problem: null, problemDetail: '' };
    expect(await startMotionInTap(holder)).toBe(false);
    expect(holder).toEqual({ problem: 'denied', problemDetail: 'the browser answered "denied"' });
  });

  it('clears an earlier problem when access is granted', async () => {
    browserAnswering(async () => 'granted');
    const holder: MotionProblemHolder = { problem: 'denied', problemDetail: 'earlier' };
    expect(await startMotionInTap(holder)).toBe(true);
    expect(holder).toEqual({ problem: null, problemDetail: '' });
  });

  it('says the browser has no motion interface when there is none', async () => {
    const holder: MotionProblemHolder = { problem: null, problemDetail: '' };
    expect(await startMotionInTap(holder)).toBe(false);
    expect(holder.problem).toBe('unsupported');
  });
});
