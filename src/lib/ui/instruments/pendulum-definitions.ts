import { formatFixed } from '$lib/domain';
import type { PendulumIndices } from '$lib/pendulum';

/** The indices shown after a pendulum test, each with a one-line definition in plain words. */
export function pendulumIndexRows(i: PendulumIndices): Array<{ label: string; value: string; definition: string; code?: string }> {
  const deg = (v: number | null) => (v === null ? '–' : `${formatFixed(v, 1)}°`);
  const fit = i.fit;
  return [
    { code: 'relaxation-index', label: 'Relaxation index R2', value: i.relaxationIndex.toFixed(2), definition: 'First swing (A1) divided by the drop from start to rest (A0); about 1.6 in relaxed legs, lower when the swing is caught.' },
    { label: 'Normalised R2', value: i.normalizedRelaxationIndex.toFixed(2), definition: 'R2 / 1.6, so that about 1 is typical of a relaxed leg.' },
    { label: 'Starting angle', value: deg(i.startAngleDeg), definition: 'Knee flexion where the leg was held before release (0° = straight).' },
    { code: 'resting-angle', label: 'Resting angle', value: deg(i.restAngleDeg), definition: 'Where the leg finally settles, from the last still stretch of the recording.' },
    { label: 'First flexion peak', value: `${deg(i.firstPeakDeg)} at ${i.firstPeakTimeS.toFixed(2)} s`, definition: 'Furthest the knee bends on the first downswing, and when, after release.' },
    { label: 'A0', value: deg(i.a0Deg), definition: 'Resting minus starting angle: how far gravity takes the leg in the end.' },
    { label: 'A1 (first swing excursion)', value: deg(i.a1Deg), definition: 'First flexion peak minus starting angle: how far the first swing actually goes.' },
    { code: 'swing-count', label: 'Swings past rest', value: String(i.peakCount), definition: 'Flexion peaks that pass the resting angle by more than 1°.' },
    { label: 'First period', value: i.firstPeriodS === null ? '–' : `${i.firstPeriodS.toFixed(2)} s`, definition: 'Time between the first two flexion peaks.' },
    { label: 'Peak flexion speed', value: `${i.peakFlexionVelocityDps.toFixed(0)}°/s`, definition: 'Fastest knee bending during the first downswing.' },
    { label: 'Flexion-side area', value: `${i.flexionAreaDegS.toFixed(1)} °·s`, definition: 'Area between the curve and the resting line while the knee is bent past rest.' },
    { label: 'Extension-side area', value: `${i.extensionAreaDegS.toFixed(1)} °·s`, definition: 'Area between the curve and the resting line while the knee is straighter than rest.' },
    { label: 'Dominant side', value: i.dominantSide, definition: 'Which side holds more area: hints at a flexor- or extensor-type pattern.' },
    {
      label: 'Damped fit',
      value: fit.converged ? `τ ${fit.tauS?.toFixed(2)} s · ω ${fit.omegaRadS?.toFixed(2)} rad/s · R² ${fit.r2?.toFixed(3)}` : 'did not converge',
      definition: 'Best damped oscillation through the swing: τ is how fast it dies out, ω how fast it swings.',
    },
    { label: 'Sample rate', value: `${i.sampleRateHz.toFixed(0)} Hz`, definition: 'Uniform rate the recording was resampled to.' },
  ];
}
