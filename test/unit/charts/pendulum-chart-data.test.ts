import { describe, expect, it } from 'vitest';
import { pendulumChartData, PENDULUM_REST_SHOWN_S } from '../../../src/lib/charts/pendulum-chart-options';
import { analysePendulumTrace } from '../../../src/lib/pendulum/index';
import { sampleTrace, simulatePendulum } from '../../reference/pendulum/simulator';

describe('pendulumChartData', () => {
  it('spans the swing (half a second before release to one second after rest onset), not the whole 20 s recording', () => {
    const sampled = sampleTrace(simulatePendulum({ startAngleDeg: 5, durationS: 20 }), 100, 0.1);
    const analysis = analysePendulumTrace({ timeS: sampled.timeS, angleDeg: sampled.angleDeg });
    const xs = pendulumChartData(analysis, null)[0];
    const first = xs[0] as number;
    const last = xs[xs.length - 1] as number;
    const restOnsetS = analysis.indices.restOnsetS;
    expect(restOnsetS).toBeLessThan(12);
    expect(first).toBeGreaterThanOrEqual(-0.51);
    expect(first).toBeLessThan(-0.45);
    expect(last).toBeGreaterThanOrEqual(restOnsetS + PENDULUM_REST_SHOWN_S - 0.02);
    expect(last).toBeLessThanOrEqual(restOnsetS + PENDULUM_REST_SHOWN_S + 0.02);
    // The recording itself runs on well past that.
    expect((sampled.timeS[sampled.timeS.length - 1] as number) - analysis.indices.releaseTimeS).toBeGreaterThan(last + 5);
  });
});
