import { describe, expect, it } from 'vitest';
import { analyseMotionRecording, motionTraceChannels, reanalyseSavedRecording } from '../../../src/lib/sensors';
import { pendulumObservations } from '../../../src/lib/sensors/../pendulum';
import { phonePendulumCases, simulatePhonePendulum } from '../../reference/sensors/phone-pendulum-simulator';

describe('reanalyseSavedRecording (issue 13: saved phone recordings keep their raw samples)', () => {
  const { recording, truth } = simulatePhonePendulum({ ...phonePendulumCases(1, 31)[0], rateHz: 60 });
  const channels = motionTraceChannels(recording);
  const indices = analyseMotionRecording(recording).analysis.indices;
  const current = pendulumObservations(indices, { side: 'right' as const }).observations.map((o, i) => ({ ...o, id: `obs-${i}` }));

  it('finds nothing to change in values saved by the corrected analysis', () => {
    expect(reanalyseSavedRecording({ channels }, current)).toMatchObject({ kind: 'analysed', changes: [], added: [] });
  });
  it('lists each value an older analysis saved differently, with old and new, and the new R2 is the simulated leg\'s', () => {
    // As the old code saved it: the same record, other numbers (e.g. from the older axis reading).
    const old = current.map((o) => (o.measureCode === 'pendulum-ri' ? { ...o, value: { kind: 'index' as const, value: 0.93 } } : o));
    const outcome = reanalyseSavedRecording({ channels }, old);
    expect(outcome.kind).toBe('analysed');
    if (outcome.kind !== 'analysed') return;
    expect(outcome.changes.map((c) => c.measureCode)).toEqual(['pendulum-ri']);
    expect(outcome.changes[0]?.before).toEqual({ kind: 'index', value: 0.93 });
    const after = outcome.changes[0]?.after as { value: number };
    expect(Math.abs(after.value - truth.r2)).toBeLessThan(0.1);
  });
  it('says when a trace is no phone recording, and when the corrected analysis refuses it', () => {
    expect(reanalyseSavedRecording({ channels: [{ name: 'knee', unit: 'deg', samples: new Float64Array(3) }] }, current).kind).toBe('not-a-phone-recording');
    const still = channels.map((c) => (c.name.startsWith('rate_') ? { ...c, samples: new Float64Array(c.samples.length) } : c));
    const outcome = reanalyseSavedRecording({ channels: still }, current);
    expect(outcome).toMatchObject({ kind: 'refused', reason: expect.stringMatching(/no fall found/) });
  });
});
