import type { ClinicalEvent, EventKind, Side } from '../domain';
import { DAY_MS, type DemoContext } from './demo-context';
import type { DemoPatient } from './demo-patient';

/** When the interventions happened and how deep their invented effects are. */
export interface DemoInterventions {
  readonly toxinDays: readonly number[];
  readonly toxinHoldDays: number;
  readonly toxinDepth: number;
  readonly castingStartMs: number;
  readonly castingGainDeg: number;
  readonly medicationMs: number;
  readonly medicationDepth: number;
}

/**
 * The patient's interventions as events, with plausible timing (toxin every 90–130 days, a casting
 * series, an orthosis, a medication or pump change, a therapy block, a surgical review).
 */
export function demoInterventions(ctx: DemoContext, patient: DemoPatient): DemoInterventions {
  const { rng, tables, idAt, stamps, day, endMs } = ctx;
  const { profile, sides, startMs, patientId, deviceId, clinicianId } = patient;
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
  return { toxinDays, toxinHoldDays, toxinDepth, castingStartMs, castingGainDeg, medicationMs, medicationDepth };
}
