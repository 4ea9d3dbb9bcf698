import type { Side } from '../domain';
import { DAY_MS, type DemoContext } from './demo-context';
import { demoInterventions } from './demo-interventions';
import type { DemoPatient } from './demo-patient';

/** The patient's invented course: latent tone (MAS rank scale 0..5) and passive range at any instant. */
export interface DemoCourse {
  readonly toneAt: (site: string, side: Side, ms: number) => number;
  readonly romAt: (site: string, side: Side, ms: number) => number;
  /** Fixed loss of range from contracture (deg). */
  readonly contractureDeg: number;
}

/**
 * Draws the patient's latent state (tone per site and side, range per ROM site, contracture), then
 * the interventions (demoInterventions), and models their effects: toxin lowers tone over ~2 weeks,
 * holds 6–12 weeks and drifts back; serial casting gains ankle dorsiflexion; medication lowers tone.
 * The draw order is part of the seeded scenario: change it and every demo record changes.
 */
export function demoCourse(ctx: DemoContext, patient: DemoPatient): DemoCourse {
  const { rng } = ctx;
  const { profile, sides, startMs } = patient;
  // Latent tone per muscle site and side, on the MAS rank scale 0..5 (invented model).
  const tone0 = new Map<string, number>();
  for (const site of new Set([...profile.mas, ...profile.tardieu, 'knee-extensors'])) for (const side of sides) tone0.set(`${site}:${side}`, rng.uniform(1.6, 3.4));
  const romBase = new Map<string, number>();
  for (const r of profile.rom) for (const side of sides) romBase.set(`${r.site}:${side}`, rng.uniform(r.baseline[0], r.baseline[1]));
  const contractureDeg = rng.uniform(0, 15);
  const { toxinDays, toxinHoldDays, toxinDepth, castingStartMs, castingGainDeg, medicationMs, medicationDepth } = demoInterventions(ctx, patient);
  const rampHold = (daysSince: number, holdDays: number) => {
    if (daysSince < 0) return 0;
    if (daysSince < 14) return daysSince / 14;
    if (daysSince < holdDays) return 1;
    return Math.max(0, 1 - (daysSince - holdDays) / 28);
  };
  const toneAt = (site: string, side: Side, ms: number) => {
    let tone = tone0.get(`${site}:${side}`) ?? 2;
    tone += (0.1 * (ms - startMs)) / (90 * DAY_MS); // slow drift upward
    if (profile.toxinSites.includes(site)) for (const t of toxinDays) tone -= toxinDepth * rampHold((ms - t) / DAY_MS, toxinHoldDays);
    if (Number.isFinite(medicationMs) && ms > medicationMs) tone -= medicationDepth * Math.min(1, (ms - medicationMs) / (14 * DAY_MS));
    return tone;
  };
  const romAt = (site: string, side: Side, ms: number) => {
    let angle = romBase.get(`${site}:${side}`) ?? 0;
    if (site === 'ankle-dorsiflexion' && Number.isFinite(castingStartMs) && ms > castingStartMs) {
      const d = (ms - castingStartMs) / DAY_MS;
      angle += castingGainDeg * (d < 21 ? d / 21 : Math.max(0.6, 1 - (0.4 * (d - 21)) / 120));
    }
    if (site === 'elbow-extension' || site === 'wrist-extension') {
      // Less tone lets the joint open a little further.
      angle += 3 * ((tone0.get(`elbow-flexors:${side}`) ?? 2) - toneAt('elbow-flexors', side, ms));
    }
    return angle;
  };
  return { toneAt, romAt, contractureDeg };
}
