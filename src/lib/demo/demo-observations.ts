import type { Observation, ObservationValue } from '../domain';
import { roundTo as round } from '../stats';
import { clamp, type DemoContext } from './demo-context';
import type { DemoCourse } from './demo-course';
import type { DemoPatient } from './demo-patient';
import { demoPendulumTrace } from './demo-pendulum-trace';
import { MAS_LABELS, TARDIEU_FULL_RANGE_DEG } from './demo-profiles';

/** One assessment being filled: when, by whom, and how to add an observation to it. */
export interface DemoVisit {
  readonly performedMs: number;
  readonly assessorId: string;
  readonly assessmentId: string;
  readonly observe: (measureCode: string, siteCode: string, side: Observation['side'], value: ObservationValue, extra?: Partial<Observation>) => Observation;
}

/** Modified Ashworth grades from the latent tone with noise; the first patient's first grade also gets a deleted duplicate. */
export function observeMas(ctx: DemoContext, patient: DemoPatient, course: DemoCourse, visit: DemoVisit, tombstone: { done: boolean }): void {
  const { rng, idAt, iso } = ctx;
  const { profile, sides } = patient;
  const { toneAt } = course;
  const { performedMs, observe } = visit;
  for (const site of profile.mas) {
    for (const side of sides) {
      const rank = clamp(Math.round(toneAt(site, side, performedMs) + rng.normal(0, 0.35)), 0, 5);
      const obs = observe('mas', site, side, { kind: 'ordinal', grade: MAS_LABELS[rank]!, rank });
      if (!tombstone.done) {
        // A duplicate entered by mistake and deleted a few minutes later: a tombstone in the bundle.
        tombstone.done = true;
        const dup = observe('mas', site, side, { kind: 'ordinal', grade: MAS_LABELS[rank]!, rank });
        Object.assign(dup, { id: idAt(Date.parse(obs.createdAt) + 30_000), deleted: true, updatedAt: iso(Date.parse(dup.createdAt) + 5 * 60_000) });
      }
    }
  }
}

/** Modified Tardieu R1, R2 and quality from the latent tone and the contracture. */
export function observeTardieu(ctx: DemoContext, patient: DemoPatient, course: DemoCourse, visit: DemoVisit): void {
  const { rng } = ctx;
  const { profile, sides } = patient;
  const { toneAt, contractureDeg } = course;
  const { performedMs, observe } = visit;
  for (const site of profile.tardieu) {
    for (const side of sides) {
      const tone = toneAt(site, side, performedMs);
      const full = TARDIEU_FULL_RANGE_DEG[site] ?? 90;
      const r2 = clamp(Math.round(full - contractureDeg * (full / 145) + rng.normal(0, 3)), 5, 180);
      const r1 = clamp(Math.round(r2 - full * (0.05 + 0.12 * Math.max(0, tone)) + rng.normal(0, 4)), 0, r2);
      // Ankle sites read from neutral (0° = foot at 90° to the leg), the others from the muscle's
      // shortest position: the ankle's range from full plantarflexion (−50°) is shifted to neutral.
      const fromNeutral = site.startsWith('ankle') ? -50 : 0;
      const quality = tone < 1 ? 1 : tone < 2.2 ? 2 : site.startsWith('ankle') && tone > 2.8 ? 3 : 2;
      observe('tardieu', site, side, { kind: 'tardieu', r1Deg: r1 + fromNeutral, r2Deg: r2 + fromNeutral, quality, spasticityAngleDeg: r2 - r1 });
    }
  }
}

/** Passive range of motion at the profile's sites. */
export function observeRom(ctx: DemoContext, patient: DemoPatient, course: DemoCourse, visit: DemoVisit): void {
  const { rng } = ctx;
  const { profile, sides } = patient;
  const { romAt } = course;
  const { performedMs, observe } = visit;
  for (const rom of profile.rom) {
    for (const side of sides) {
      observe('rom', rom.site, side, { kind: 'angle', angleDeg: Math.round(romAt(rom.site, side, performedMs) + rng.normal(0, 3)) }, { mode: 'passive', instrument: rom.instrument });
    }
  }
}

/** Pendulum indices of the first side (with a raw trace at the first and the last visits). */
export function observePendulum(ctx: DemoContext, patient: DemoPatient, course: DemoCourse, visit: DemoVisit, withTrace: boolean): void {
  const { rng, tables, idAt, stamps, iso } = ctx;
  const { sides, patientId, deviceId } = patient;
  const { toneAt } = course;
  const { performedMs, assessorId, assessmentId, observe } = visit;
  const side = sides[0]!;
  const ri = round(clamp(1.68 - 0.24 * toneAt('knee-extensors', side, performedMs) + rng.normal(0, 0.06), 0.8, 1.75), 2);
  const restDeg = round(rng.uniform(78, 90), 1);
  let traceId: string | null = null;
  if (withTrace) {
    traceId = idAt(performedMs + 30_000);
    tables.traces.push({
      id: traceId, ...stamps(performedMs + 30_000, deviceId, assessorId), patientId, assessmentId, kind: 'pendulum-knee-angle',
      startedAt: iso(performedMs + 30_000), sampleRateHz: 100, channels: [{ name: 'knee-flexion', unit: 'deg', samples: demoPendulumTrace(ri, restDeg, rng) }],
    });
  }
  const link = { traceId };
  observe('pendulum-ri', 'knee', side, { kind: 'index', value: ri }, link);
  observe('pendulum-ri-normalised', 'knee', side, { kind: 'index', value: round(ri / 1.6, 3) }, link);
  observe('pendulum-first-swing', 'knee', side, { kind: 'angle', angleDeg: round(ri * restDeg, 1) }, link);
  observe('pendulum-resting-angle', 'knee', side, { kind: 'angle', angleDeg: restDeg }, link);
  observe('pendulum-swing-count', 'knee', side, { kind: 'count', value: clamp(Math.round(1 + (6 * (ri - 0.8)) / 0.9 + rng.normal(0, 0.5)), 0, 9) }, link);
}

/** Penn spasm frequency and spasm severity from the knee extensors' tone. */
export function observeSpasms(ctx: DemoContext, patient: DemoPatient, course: DemoCourse, visit: DemoVisit): void {
  const { rng } = ctx;
  const { sides } = patient;
  const { toneAt } = course;
  const { performedMs, observe } = visit;
  const tone = toneAt('knee-extensors', sides[0]!, performedMs);
  observe('penn-spasm-frequency', 'whole-body', 'none', { kind: 'rating', value: clamp(Math.round(0.3 + 0.9 * tone + rng.normal(0, 0.5)), 0, 4) });
  observe('spasm-severity', 'whole-body', 'none', { kind: 'rating', value: clamp(Math.round(1 + 1.4 * tone + rng.normal(0, 1)), 0, 10) });
}
