import {
  EMPTY_DOSE,
  TABLE_NAMES,
  formatUuidV7,
  patientCode,
  type Assessment,
  type ClinicalEvent,
  type ExerciseDose,
  type EventKind,
  type Instrument,
  type Observation,
  type ObservationValue,
  type RecordTables,
  type Side,
  type TableName,
} from '../domain';
import { DEMO_FAMILY_NAMES, DEMO_FICTION_NOTICE, DEMO_GIVEN_NAMES, DEMO_NOTES, DEMO_TEAM } from './demo-people';
import { SeededRandom } from './seeded-random';

export type DemoTables = { [K in TableName]: RecordTables[K][] };

export interface DemoOptions {
  readonly seed: number;
  /** Last day of the scenario, `YYYY-MM-DD`; the app passes today, the CLI a fixed default. */
  readonly endDate?: string;
  readonly patientCount?: number;
}

export interface DemoScenario {
  readonly seed: number;
  readonly endAt: string;
  readonly tables: DemoTables;
}

/** Fixed default end date, so `kinnote demo --seed N` gives the same file on every run. */
export const DEMO_DEFAULT_END_DATE = '2025-06-30';

const DAY_MS = 86_400_000;
/** The demo home programme: calf stretch and sit-to-stand on 5 days a week, a resting splint each night (5 + 5 + 7). */
const DEMO_DOSE: ExerciseDose = EMPTY_DOSE;
const DEMO_SESSIONS_PER_WEEK = 17;
const MAS_LABELS = ['0', '1', '1+', '2', '3', '4'] as const;

interface RomPlan {
  readonly site: string;
  readonly baseline: readonly [number, number];
  readonly instrument: Instrument;
}
interface Profile {
  readonly condition: RecordTables['patients']['condition'];
  readonly bilateral: boolean;
  readonly mas: readonly string[];
  readonly tardieu: readonly string[];
  readonly rom: readonly RomPlan[];
  readonly pendulum: boolean;
  readonly spasms: boolean;
  readonly interventions: readonly EventKind[];
  readonly toxinMuscles: string;
  readonly toxinSites: readonly string[];
}

/** Six invented caseload profiles, cycled over the patients. */
const PROFILES: readonly Profile[] = [
  {
    condition: 'stroke', bilateral: false, mas: ['elbow-flexors', 'wrist-flexors', 'ankle-plantarflexors'], tardieu: ['elbow-flexors'],
    rom: [{ site: 'elbow-extension', baseline: [-30, -8], instrument: 'universal-goniometer' }, { site: 'wrist-extension', baseline: [0, 35], instrument: 'universal-goniometer' }],
    pendulum: false, spasms: false, interventions: ['botulinum-toxin-injection', 'therapy-block-start'],
    toxinMuscles: 'biceps brachii, brachioradialis, flexor carpi radialis', toxinSites: ['elbow-flexors', 'wrist-flexors'],
  },
  {
    condition: 'stroke', bilateral: false, mas: ['ankle-plantarflexors', 'knee-extensors'], tardieu: ['ankle-gastrocnemius'],
    rom: [{ site: 'ankle-dorsiflexion', baseline: [-12, 6], instrument: 'universal-goniometer' }],
    pendulum: false, spasms: false, interventions: ['botulinum-toxin-injection', 'orthosis'],
    toxinMuscles: 'gastrocnemius (medial and lateral heads), soleus', toxinSites: ['ankle-plantarflexors', 'ankle-gastrocnemius'],
  },
  {
    condition: 'multiple-sclerosis', bilateral: true, mas: ['knee-extensors', 'hip-adductors', 'ankle-plantarflexors'], tardieu: [],
    rom: [{ site: 'knee-extension', baseline: [-15, 0], instrument: 'inclinometer' }],
    pendulum: true, spasms: true, interventions: ['oral-medication-change', 'therapy-block-start'], toxinMuscles: '', toxinSites: [],
  },
  {
    condition: 'spinal-cord-injury', bilateral: true, mas: ['knee-extensors', 'ankle-plantarflexors', 'hip-adductors'], tardieu: ['knee-extensors'],
    rom: [{ site: 'hip-abduction', baseline: [15, 35], instrument: 'universal-goniometer' }],
    pendulum: true, spasms: true, interventions: ['intrathecal-pump-change'], toxinMuscles: '', toxinSites: [],
  },
  {
    condition: 'acquired-brain-injury', bilateral: false, mas: ['ankle-plantarflexors', 'elbow-flexors'], tardieu: ['ankle-soleus'],
    rom: [{ site: 'ankle-dorsiflexion', baseline: [-20, -2], instrument: 'universal-goniometer' }],
    pendulum: false, spasms: false, interventions: ['serial-casting', 'orthosis'], toxinMuscles: '', toxinSites: [],
  },
  {
    condition: 'cerebral-palsy', bilateral: true, mas: ['knee-flexors', 'ankle-plantarflexors'], tardieu: ['knee-flexors'],
    rom: [{ site: 'knee-extension', baseline: [-25, -5], instrument: 'universal-goniometer' }, { site: 'ankle-dorsiflexion', baseline: [-10, 8], instrument: 'phone-sensor' }],
    pendulum: false, spasms: false, interventions: ['botulinum-toxin-injection', 'therapy-block-start', 'surgery'],
    toxinMuscles: 'medial hamstrings', toxinSites: ['knee-flexors'],
  },
];

/** Range reached from the muscle's shortest position at slow stretch without contracture (invented, plausible). */
const TARDIEU_FULL_RANGE_DEG: Readonly<Record<string, number>> = {
  'elbow-flexors': 145, 'wrist-flexors': 140, 'knee-flexors': 120, 'knee-extensors': 130, 'ankle-gastrocnemius': 65, 'ankle-soleus': 70, 'hip-adductors': 45,
};

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));
const round = (x: number, digits = 0) => {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
};

/**
 * Generates the invented demo caseload: an invented three-clinician community team with two
 * tablets, about 12 invented patients (pseudonymous codes, invented identities), 6–12 months of
 * assessments every 3–6 weeks with MAS, Modified Tardieu, ROM, pendulum indices (with a few raw
 * traces) and spasm scales, interventions with plausible responses (toxin: tone falls over ~2
 * weeks, holds 6–12 weeks, drifts back; serial casting gains ankle dorsiflexion; medication
 * changes lower tone and spasms), home programmes with adherence and self-reports for some, one
 * tombstoned duplicate and a small reliability study. Values come from a simple invented model
 * with noise, not from any publication. Pure and deterministic: same options → identical records.
 * Throws RangeError for a bad end date or patient count.
 */
export function generateDemoScenario(options: DemoOptions): DemoScenario {
  const endDate = options.endDate ?? DEMO_DEFAULT_END_DATE;
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(endDate);
  if (!m) throw new RangeError(`endDate must be YYYY-MM-DD, not ${endDate}`);
  const patientCount = options.patientCount ?? 12;
  if (!Number.isInteger(patientCount) || patientCount < 1 || patientCount > 500) throw new RangeError('patientCount must be 1..500');
  const rng = new SeededRandom(options.seed);
  const endMs = Date.UTC(+m[1]!, +m[2]! - 1, +m[3]!, 17, 0, 0);
  const tables = Object.fromEntries(TABLE_NAMES.map((t) => [t, []])) as unknown as DemoTables;
  const iso = (ms: number) => new Date(ms).toISOString();
  const day = (ms: number) => iso(ms).slice(0, 10);
  const idAt = (ms: number) => formatUuidV7(ms, rng.int(0, 0xfff), rng.bytes(8));
  const stamps = (ms: number, deviceId: string, clinicianId: string) => ({ createdAt: iso(ms), updatedAt: iso(ms), deviceId, clinicianId, deleted: false });

  // The team and its devices, set up a little before the first patient.
  const setupMs = endMs - 400 * DAY_MS;
  const deviceIds = [idAt(setupMs), idAt(setupMs + 60_000)];
  const clinicianIds = DEMO_TEAM.map((_, i) => idAt(setupMs + 120_000 + i * 60_000));
  deviceIds.forEach((id, i) =>
    tables.devices.push({ id, ...stamps(setupMs + i * 60_000, deviceIds[0]!, clinicianIds[0]!), name: `Team tablet ${'AB'[i]} (demo)`, platform: 'demo' }),
  );
  DEMO_TEAM.forEach((c, i) =>
    tables.clinicians.push({ id: clinicianIds[i]!, ...stamps(setupMs + 120_000 + i * 60_000, deviceIds[0]!, clinicianIds[0]!), displayName: c.displayName, profession: c.profession, registration: null }),
  );

  for (let p = 0; p < patientCount; p++) {
    const profile = PROFILES[p % PROFILES.length]!;
    const clinicianId = clinicianIds[p % clinicianIds.length]!;
    const deviceId = deviceIds[p % deviceIds.length]!;
    const months = rng.int(6, 12);
    const startMs = endMs - months * 30 * DAY_MS + rng.int(0, 10) * DAY_MS;
    const sides: Side[] = profile.bilateral ? ['left', 'right'] : [rng.pick(['left', 'right'] as const)];
    const birthYear = profile.condition === 'cerebral-palsy' ? rng.int(1995, 2007) : rng.int(1942, 1990);
    const patientId = idAt(startMs - 7 * DAY_MS);
    const enrolled = stamps(startMs - 7 * DAY_MS, deviceId, clinicianId);
    tables.patients.push({
      id: patientId, ...enrolled, code: patientCode((n) => rng.bytes(n)), birthYear, condition: profile.condition, affectedSides: sides,
      status: p === patientCount - 1 && patientCount > 3 ? 'discharged' : 'active',
    });
    tables.identities.push({
      id: idAt(startMs - 7 * DAY_MS + 1000), ...enrolled, patientId,
      givenName: DEMO_GIVEN_NAMES[(p * 7 + rng.int(0, 3)) % DEMO_GIVEN_NAMES.length]!,
      familyName: DEMO_FAMILY_NAMES[(p * 5 + rng.int(0, 2)) % DEMO_FAMILY_NAMES.length]!,
      dateOfBirth: `${birthYear}-${String(rng.int(1, 12)).padStart(2, '0')}-${String(rng.int(1, 28)).padStart(2, '0')}`,
      contact: DEMO_FICTION_NOTICE,
    });

    // Latent tone per muscle site and side, on the MAS rank scale 0..5 (invented model).
    const tone0 = new Map<string, number>();
    for (const site of new Set([...profile.mas, ...profile.tardieu, 'knee-extensors'])) for (const side of sides) tone0.set(`${site}:${side}`, rng.uniform(1.6, 3.4));
    const romBase = new Map<string, number>();
    for (const r of profile.rom) for (const side of sides) romBase.set(`${r.site}:${side}`, rng.uniform(r.baseline[0], r.baseline[1]));
    const contractureDeg = rng.uniform(0, 15);

    // Interventions.
    const toxinDays: number[] = [];
    const toxinHoldDays = rng.uniform(42, 84);
    const toxinDepth = rng.uniform(1.0, 1.8);
    let castingStartMs = Number.NaN;
    let castingGainDeg = 0;
    let medicationMs = Number.NaN;
    let medicationDepth = 0;
    const addEvent = (kind: EventKind, ms: number, extra: Partial<ClinicalEvent>) => {
      tables.events.push({
        id: idAt(ms), ...stamps(ms, deviceId, clinicianId), patientId, kind, occurredOn: day(ms), endsOn: null,
        side: profile.bilateral ? 'both' : (sides[0] as Side), summary: '', muscles: null, dose: null, notes: null, ...extra,
      });
    };
    for (const kind of profile.interventions) {
      switch (kind) {
        case 'botulinum-toxin-injection': {
          let t = startMs + rng.int(20, 50) * DAY_MS;
          while (t < endMs - 21 * DAY_MS) {
            toxinDays.push(t);
            addEvent(kind, t, { summary: 'Botulinum toxin type A injection (demo)', muscles: profile.toxinMuscles, dose: `${rng.pick([100, 150, 200, 250])} units total, dilution as local protocol` });
            t += rng.int(90, 130) * DAY_MS;
          }
          break;
        }
        case 'serial-casting': {
          castingStartMs = startMs + rng.int(30, 60) * DAY_MS;
          castingGainDeg = rng.uniform(9, 15);
          addEvent(kind, castingStartMs, { summary: 'Serial casting, three weekly below-knee casts (demo)', endsOn: day(castingStartMs + 21 * DAY_MS) });
          break;
        }
        case 'orthosis':
          addEvent(kind, startMs + rng.int(80, 110) * DAY_MS, { summary: 'Ankle-foot orthosis issued for daytime wear (demo)' });
          break;
        case 'oral-medication-change':
          medicationMs = startMs + rng.int(40, 90) * DAY_MS;
          medicationDepth = rng.uniform(0.4, 0.8);
          addEvent(kind, medicationMs, { summary: 'Oral antispastic dose increased by the prescriber (demo)' });
          break;
        case 'intrathecal-pump-change':
          medicationMs = startMs + rng.int(60, 120) * DAY_MS;
          medicationDepth = rng.uniform(0.6, 1.1);
          addEvent(kind, medicationMs, { summary: 'Intrathecal pump refill with a higher daily dose (demo)' });
          break;
        case 'therapy-block-start': {
          const t = startMs + rng.int(5, 15) * DAY_MS;
          addEvent(kind, t, { summary: 'Eight-week community therapy block (demo)' });
          addEvent('therapy-block-end', t + 56 * DAY_MS, { summary: 'End of therapy block (demo)' });
          break;
        }
        case 'surgery':
          if (rng.chance(0.5)) addEvent(kind, endMs - rng.int(20, 40) * DAY_MS, { summary: 'Orthopaedic review; soft-tissue surgery planned (demo)', notes: 'Family asked for a written plan before deciding.' });
          break;
        default:
          break;
      }
    }
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

    // Assessments every 3–6 weeks.
    let assessmentCount = 0;
    let tombstoneDone = p !== 0;
    for (let t = startMs; t <= endMs; t += rng.int(21, 42) * DAY_MS) {
      const performedMs = t - (t % DAY_MS) + rng.int(8, 15) * 3_600_000 + rng.int(0, 3) * 900_000;
      const assessorId = rng.chance(0.8) ? clinicianId : rng.pick(clinicianIds);
      const setting: Assessment['setting'] = assessmentCount > 0 && rng.chance(0.15) ? 'home' : 'clinic';
      const assessmentId = idAt(performedMs);
      tables.assessments.push({
        id: assessmentId, ...stamps(performedMs, deviceId, assessorId), patientId, assessorId, performedAt: iso(performedMs), setting,
        conditions: {
          position: profile.pendulum ? 'sitting' : 'supine',
          minutesSinceMedication: profile.spasms ? rng.int(60, 300) : null,
          painNrs: rng.int(0, 4),
        },
        notes: rng.chance(0.3) ? rng.pick(DEMO_NOTES) : null,
      });
      assessmentCount++;
      let minute = 1;
      const observe = (measureCode: string, siteCode: string, side: Observation['side'], value: ObservationValue, extra: Partial<Observation> = {}) => {
        const ms = performedMs + minute++ * 60_000;
        const obs: Observation = {
          id: idAt(ms), ...stamps(ms, deviceId, assessorId), patientId, assessmentId, takenAt: iso(performedMs), measureCode, siteCode, side,
          mode: null, instrument: null, value, traceId: null, ...extra,
        };
        tables.observations.push(obs);
        return obs;
      };
      for (const site of profile.mas) {
        for (const side of sides) {
          const rank = clamp(Math.round(toneAt(site, side, performedMs) + rng.normal(0, 0.35)), 0, 5);
          const obs = observe('mas', site, side, { kind: 'ordinal', grade: MAS_LABELS[rank]!, rank });
          if (!tombstoneDone) {
            // A duplicate entered by mistake and deleted a few minutes later: a tombstone in the bundle.
            tombstoneDone = true;
            const dup = observe('mas', site, side, { kind: 'ordinal', grade: MAS_LABELS[rank]!, rank });
            Object.assign(dup, { id: idAt(Date.parse(obs.createdAt) + 30_000), deleted: true, updatedAt: iso(Date.parse(dup.createdAt) + 5 * 60_000) });
          }
        }
      }
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
      for (const rom of profile.rom) {
        for (const side of sides) {
          observe('rom', rom.site, side, { kind: 'angle', angleDeg: Math.round(romAt(rom.site, side, performedMs) + rng.normal(0, 3)) }, { mode: 'passive', instrument: rom.instrument });
        }
      }
      if (profile.pendulum) {
        const side = sides[0]!;
        const ri = round(clamp(1.68 - 0.24 * toneAt('knee-extensors', side, performedMs) + rng.normal(0, 0.06), 0.8, 1.75), 2);
        const restDeg = round(rng.uniform(78, 90), 1);
        const withTrace = assessmentCount === 1 || t + 42 * DAY_MS > endMs;
        let traceId: string | null = null;
        if (withTrace) {
          traceId = idAt(performedMs + 30_000);
          tables.traces.push({
            id: traceId, ...stamps(performedMs + 30_000, deviceId, assessorId), patientId, assessmentId, kind: 'pendulum-knee-angle',
            startedAt: iso(performedMs + 30_000), sampleRateHz: 100, channels: [{ name: 'knee-flexion', unit: 'deg', samples: pendulumTrace(ri, restDeg, rng) }],
          });
        }
        const link = { traceId };
        observe('pendulum-ri', 'knee', side, { kind: 'index', value: ri }, link);
        observe('pendulum-ri-normalised', 'knee', side, { kind: 'index', value: round(ri / 1.6, 3) }, link);
        observe('pendulum-first-swing', 'knee', side, { kind: 'angle', angleDeg: round(ri * restDeg, 1) }, link);
        observe('pendulum-resting-angle', 'knee', side, { kind: 'angle', angleDeg: restDeg }, link);
        observe('pendulum-swing-count', 'knee', side, { kind: 'count', value: clamp(Math.round(1 + (6 * (ri - 0.8)) / 0.9 + rng.normal(0, 0.5)), 0, 9) }, link);
      }
      if (profile.spasms) {
        const tone = toneAt('knee-extensors', sides[0]!, performedMs);
        observe('penn-spasm-frequency', 'whole-body', 'none', { kind: 'rating', value: clamp(Math.round(0.3 + 0.9 * tone + rng.normal(0, 0.5)), 0, 4) });
        observe('spasm-severity', 'whole-body', 'none', { kind: 'rating', value: clamp(Math.round(1 + 1.4 * tone + rng.normal(0, 1)), 0, 10) });
      }
    }

    // Home programme, adherence and self-reports for a few patients.
    if (p % 4 === 2 || p % 4 === 0) {
      const programmeMs = startMs + 14 * DAY_MS;
      const programmeId = idAt(programmeMs);
      tables.homeProgrammes.push({
        id: programmeId, ...stamps(programmeMs, deviceId, clinicianId), patientId, title: 'Daily stretching and positioning (demo)',
        items: [
          { name: 'Calf stretch against a wall', dosage: '', dose: { ...DEMO_DOSE, holdSeconds: 30, repetitions: 3, daysPerWeek: 5, note: 'each side' } },
          { name: 'Sit-to-stand practice', dosage: '', dose: { ...DEMO_DOSE, repetitions: 8, sets: 2, daysPerWeek: 5 } },
          { name: 'Resting splint', dosage: '', dose: { ...DEMO_DOSE, overnight: true, note: 'as tolerated' } },
        ],
        sessionsPerWeek: DEMO_SESSIONS_PER_WEEK, startsOn: day(programmeMs), endsOn: null,
      });
      const keenness = rng.uniform(0.5, 0.95);
      for (let w = programmeMs; w + 7 * DAY_MS <= endMs; w += 7 * DAY_MS) {
        const reportMs = w + 7 * DAY_MS - 3_600_000;
        let done = 0;
        for (let s = 0; s < 5; s++) if (rng.chance(keenness)) done++;
        // Five draws as before (the seeded scenario stays the same), scaled to the week's planned sessions.
        tables.adherenceEntries.push({
          id: idAt(reportMs), ...stamps(reportMs, deviceId, clinicianId), patientId, programmeId, periodStart: day(w), sessionsPlanned: DEMO_SESSIONS_PER_WEEK,
          sessionsDone: Math.round((done * DEMO_SESSIONS_PER_WEEK) / 5),
          reportedBy: rng.chance(0.7) ? 'patient' : 'carer',
        });
        if (rng.chance(0.6)) {
          const tone = toneAt(profile.mas[0]!, sides[0]!, reportMs);
          tables.selfReports.push({
            id: idAt(reportMs + 60_000), ...stamps(reportMs + 60_000, deviceId, clinicianId), patientId, reportedOn: day(reportMs),
            spasmFrequencyPenn: profile.spasms ? clamp(Math.round(0.3 + 0.9 * tone + rng.normal(0, 0.6)), 0, 4) : null,
            spasmSeverityNrs: profile.spasms ? clamp(Math.round(1 + 1.4 * tone + rng.normal(0, 1.2)), 0, 10) : null,
            stiffnessNrs: clamp(Math.round(1.5 * tone + rng.normal(0, 1.2)), 0, 10),
            painNrs: clamp(Math.round(rng.normal(2, 1.3)), 0, 10),
          });
        }
      }
    }
  }

  // A small inter-rater study of passive ankle dorsiflexion on invented volunteers.
  const studyMs = endMs - 60 * DAY_MS;
  const trials: RecordTables['reliabilityStudies']['trials'][number][] = [];
  const bias = [0, rng.normal(0, 1.5)];
  for (let s = 1; s <= 8; s++) {
    const truth = rng.uniform(5, 20);
    for (let rater = 0; rater < 2; rater++) {
      for (let trial = 1; trial <= 2; trial++) {
        trials.push({ subjectLabel: `V${String(s).padStart(2, '0')}`, raterIndex: rater, trial, value: Math.round(truth + bias[rater]! + rng.normal(0, 2.5)) });
      }
    }
  }
  tables.reliabilityStudies.push({
    id: idAt(studyMs), ...stamps(studyMs, deviceIds[0]!, clinicianIds[0]!), title: 'Ankle dorsiflexion, two raters, two trials (demo volunteers)',
    measureCode: 'rom', siteCode: 'ankle-dorsiflexion', design: 'inter-rater', raterIds: [clinicianIds[0]!, clinicianIds[2]!], trials, notes: null, adoption: null,
  });

  return { seed: options.seed, endAt: iso(endMs), tables };
}

/**
 * A knee-angle trace for a leg-drop pendulum test, 12 s at 100 Hz: the step response of a damped
 * linear pendulum from full extension (0°) toward `restDeg`, with its damping ratio chosen so the
 * first swing overshoots by (ri − 1)·restDeg (the relaxation index A1/A0 = 1 + overshoot), period
 * about 1.1 s, and 0.3° noise. A demo signal, not a physiological model.
 */
function pendulumTrace(ri: number, restDeg: number, rng: SeededRandom): Float64Array<ArrayBuffer> {
  const overshoot = ri - 1;
  const zeta = overshoot > 0.01 ? -Math.log(overshoot) / Math.sqrt(Math.PI ** 2 + Math.log(overshoot) ** 2) : 0.95;
  const omegaDamped = (2 * Math.PI) / 1.1;
  const omegaNatural = omegaDamped / Math.sqrt(Math.max(1e-6, 1 - zeta * zeta));
  const samples = new Float64Array(1200);
  for (let i = 0; i < samples.length; i++) {
    const t = i / 100;
    const decay = Math.exp(-zeta * omegaNatural * t);
    const shape = Math.cos(omegaDamped * t) + ((zeta * omegaNatural) / omegaDamped) * Math.sin(omegaDamped * t);
    samples[i] = round(restDeg - restDeg * decay * shape + rng.normal(0, 0.3), 3);
  }
  return samples;
}
