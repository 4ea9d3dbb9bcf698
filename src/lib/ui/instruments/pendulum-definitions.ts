import { formatFixed } from '$lib/domain';
import type { PendulumIndices } from '$lib/pendulum';
import { INSTRUMENT_MESSAGES as m } from '../messages/instrument-messages';

/** The indices shown after a pendulum test, each with a one-line definition in plain words (from the catalogue). */
export function pendulumIndexRows(i: PendulumIndices): Array<{ label: string; value: string; definition: string; code?: string }> {
  const deg = (v: number | null) => (v === null ? m.notAvailable : `${formatFixed(v, 1)}°`);
  const fit = i.fit;
  const d = m.indices;
  return [
    { code: 'relaxation-index', ...d.relaxationIndex, value: i.relaxationIndex.toFixed(2) },
    { ...d.normalizedRelaxationIndex, value: i.normalizedRelaxationIndex.toFixed(2) },
    { ...d.startAngle, value: deg(i.startAngleDeg) },
    { code: 'resting-angle', ...d.restAngle, value: deg(i.restAngleDeg) },
    { ...d.firstPeak, value: m.peakAt(deg(i.firstPeakDeg), i.firstPeakTimeS.toFixed(2)) },
    { ...d.a0, value: deg(i.a0Deg) },
    { ...d.a1, value: deg(i.a1Deg) },
    { code: 'swing-count', ...d.swingCount, value: String(i.peakCount) },
    { ...d.firstPeriod, value: i.firstPeriodS === null ? m.notAvailable : `${i.firstPeriodS.toFixed(2)} s` },
    { ...d.peakFlexionSpeed, value: `${i.peakFlexionVelocityDps.toFixed(0)}°/s` },
    { ...d.flexionArea, value: `${i.flexionAreaDegS.toFixed(1)} °·s` },
    { ...d.extensionArea, value: `${i.extensionAreaDegS.toFixed(1)} °·s` },
    { ...d.dominantSide, value: i.dominantSide },
    { ...d.dampedFit, value: fit.converged ? `τ ${fit.tauS?.toFixed(2)} s · ω ${fit.omegaRadS?.toFixed(2)} rad/s · R² ${fit.r2?.toFixed(3)}` : m.didNotConverge },
    { ...d.sampleRate, value: m.sampleRateHz(i.sampleRateHz.toFixed(0)) },
  ];
}
