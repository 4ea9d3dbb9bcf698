import { describe, expect, it } from 'vitest';
import { analysePendulumTrace, pendulumInputFromTrace, PendulumInputError } from '../../../src/lib/pendulum/index';
import { sampleTrace, simulatePendulum } from '../../reference/pendulum/simulator';

// A 20 s recording of a relaxed leg (the swing is over within a few seconds; the rest runs on).
const sim = simulatePendulum({ startAngleDeg: 8, durationS: 20 });
const sampled = sampleTrace(sim, 100, 0.1);
const direct = analysePendulumTrace({ timeS: sampled.timeS, angleDeg: sampled.angleDeg });

describe('pendulumInputFromTrace', () => {
  it('reads each stored layout (file import, phone recorder, demo) back to the same analysis', () => {
    const angle = sampled.angleDeg as Float64Array;
    const layouts = {
      file: [{ name: 'time', unit: 's', samples: sampled.timeS }, { name: 'knee flexion angle', unit: 'deg', samples: angle }],
      phone: [
        { name: 'time_ms', unit: 'ms', samples: Float64Array.from(sampled.timeS, (t) => t * 1000) },
        { name: 'rate_alpha_dps', unit: 'deg/s', samples: new Float64Array(angle.length).fill(40) },
        { name: 'knee_flexion_deg', unit: 'deg', samples: angle },
      ],
    };
    for (const [name, channels] of Object.entries(layouts)) {
      const input = pendulumInputFromTrace({ sampleRateHz: 100, channels }, name);
      // The phone's own rotation rate is not mistaken for the knee's velocity.
      expect(input.gyroDps, name).toBeNull();
      const again = analysePendulumTrace(input);
      expect(again.indices.relaxationIndex, name).toBeCloseTo(direct.indices.relaxationIndex, 9);
      expect(again.indices.firstPeakDeg, name).toBeCloseTo(direct.indices.firstPeakDeg, 9);
    }
  });

  it('builds the time column from the sample rate when the trace has none (the demo layout)', () => {
    const input = pendulumInputFromTrace({ sampleRateHz: 50, channels: [{ name: 'knee-flexion', unit: 'deg', samples: new Float64Array(5) }] }, 'demo');
    expect(Array.from(input.timeS)).toEqual([0, 0.02, 0.04, 0.06, 0.08]);
  });

  it('refuses a trace without a knee angle or knee velocity, naming it', () => {
    const run = () => pendulumInputFromTrace({ sampleRateHz: 50, channels: [{ name: 'acc_x_ms2', unit: 'm/s2', samples: new Float64Array(3) }] }, 'visit of 3 Mar');
    expect(run).toThrow(PendulumInputError);
    expect(run).toThrow(/^visit of 3 Mar: this trace holds no knee angle/);
  });
});
