import { CohortExportError } from './cohort-export-error';
import type { CohortIndex } from './cohort-index';
import { hex, uuidFromBytes } from './disclosure-bytes';
import type { Disclosure, DisclosurePlan, PatientView } from './prepare-disclosure';
import type { Cohort } from './select-cohort';

/** 5-year birth band, `1950-1954`: bands start at multiples of 5. */
export function birthYearBand(birthYear: number): string {
  const start = Math.floor(birthYear / 5) * 5;
  return `${start}-${start + 4}`;
}

/** One whole-day offset in [−maxShift, +maxShift] without 0 (an unshifted patient would carry real dates). */
function drawOffsetDays(rng: () => number, maxShift: number): number {
  let offsetDays = 0;
  for (let attempt = 0; offsetDays === 0; attempt++) {
    const u = rng();
    if (!(u >= 0 && u < 1)) throw new CohortExportError('disclosure.dates.rng', `returned ${u}, not a number in [0, 1)`);
    offsetDays = Math.floor(u * (2 * maxShift + 1)) - maxShift;
    if (attempt > 1000) throw new CohortExportError('disclosure.dates.rng', 'keeps returning the same value');
  }
  return offsetDays;
}

/**
 * The de-identified branch of prepareDisclosure (its doc comment gives the method and the refusals):
 * HMAC-SHA-256 pseudonyms under the per-export key, birth bands, a date offset per patient when
 * shifted, keyed clinician labels and FHIR ids unrelated to record ids.
 */
export async function deidentifiedDisclosure(
  cohort: Cohort,
  index: CohortIndex,
  disclosure: Extract<Disclosure, { kind: 'deidentified' }>,
  zeroDays: ReadonlyMap<string, number>,
  assessorIds: ReadonlySet<string>,
): Promise<DisclosurePlan> {
  const { keyBytes, dates } = disclosure;
  if (!(keyBytes instanceof Uint8Array) || keyBytes.length < 32) throw new CohortExportError('disclosure.keyBytes', 'the per-export key must be at least 32 random bytes');
  const subtle = globalThis.crypto?.subtle;
  if (!subtle) throw new CohortExportError('disclosure', 'Web Crypto (crypto.subtle) is not available here');
  const key = await subtle.importKey('raw', Uint8Array.from(keyBytes), { name: 'HMAC', hash: 'SHA-256' }, false, ['sign']);
  const encoder = new TextEncoder();
  const mac = async (message: string) => new Uint8Array(await subtle.sign('HMAC', key, encoder.encode(message)));

  const maxShift = dates.kind === 'shifted' ? (dates.maxShiftDays ?? 182) : 0;
  if (dates.kind === 'shifted' && !(Number.isInteger(maxShift) && maxShift >= 1)) {
    throw new CohortExportError('disclosure.dates.maxShiftDays', `${maxShift} must be a whole number of days ≥ 1`);
  }
  const patients = new Map<string, PatientView>();
  const seen = new Set<string>();
  for (const id of cohort.patientIds) {
    const patient = index.patients.get(id);
    if (!patient) continue;
    const digest = await mac(`patient:${id}`);
    const label = `P-${hex(digest, 0, 8)}`;
    // 64-bit labels collide with probability ≈ n²/2^65; refuse rather than merge two people.
    if (seen.has(label)) throw new CohortExportError('disclosure.keyBytes', 'two patients got the same pseudonym; export again (a new key is drawn)');
    seen.add(label);
    const offsetDays = dates.kind === 'shifted' ? drawOffsetDays(dates.rng, maxShift) : 0;
    patients.set(id, {
      label,
      birthYears: birthYearBand(patient.birthYear),
      condition: patient.condition,
      zeroDay: zeroDays.get(id) ?? 0,
      offsetDays,
      fhirUuid: uuidFromBytes(digest.subarray(16, 32)),
      identity: null,
    });
  }
  const clinicianLabels = new Map<string, string>();
  for (const cid of assessorIds) clinicianLabels.set(cid, `C-${hex(await mac(`clinician:${cid}`), 0, 6)}`);
  const seed = await mac('fhir-observations');
  const prefix = uuidFromBytes(seed).slice(0, 19); // xxxxxxxx-xxxx-4xxx-
  return {
    kind: 'deidentified',
    dateMode: dates.kind,
    patients,
    clinicianLabel: (cid) => clinicianLabels.get(cid) ?? 'C-unknown',
    observationUuid: (n) => {
      const counter = n.toString(16).padStart(15, '0');
      return `${prefix}8${counter.slice(0, 3)}-${counter.slice(3)}`;
    },
  };
}
