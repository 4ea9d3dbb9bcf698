import type { Identity } from '../domain';
import { dateOfDay, dayOfDate } from './calendar-day';
import { CohortExportError } from './cohort-export-error';
import type { CohortIndex } from './cohort-index';
import type { Cohort } from './select-cohort';

/** How dates leave a de-identified export. */
export type DeidentifiedDates =
  /** Whole days from each patient's baseline (the earliest baseline of their pairs = day 0). */
  | { readonly kind: 'days-from-baseline' }
  /**
   * Calendar dates moved by one random whole-day offset per patient, uniform in
   * [−maxShiftDays, +maxShiftDays] without 0 (default 182); intervals within a patient are kept.
   * `rng` returns uniforms in [0, 1): a cryptographic source at the edges, a seeded one in tests.
   */
  | { readonly kind: 'shifted'; readonly rng: () => number; readonly maxShiftDays?: number };

/**
 * Who the export may name. De-identified (the default the page offers): keyed-hash pseudonyms,
 * relative or shifted dates, birth years in 5-year bands, no free text, no identities. Identified:
 * only when the caller holds the identities (the page passes them only from an unlocked vault and
 * logs the export); patient codes, names, dates of birth and real dates then appear.
 */
export type Disclosure =
  | {
      readonly kind: 'deidentified';
      /** Random per-export HMAC key (≥ 32 bytes). Never stored: a new key per export makes exports unlinkable. */
      readonly keyBytes: Uint8Array;
      readonly dates: DeidentifiedDates;
    }
  | { readonly kind: 'identified'; readonly identities: readonly Identity[] };

/** How one patient appears in the export. */
export interface PatientView {
  /** `P-` + 16 hex digits of HMAC-SHA-256(key, "patient:" + id), or the patient code when identified. */
  readonly label: string;
  /** `1950-1954` (5-year band) when de-identified, the birth year when identified. */
  readonly birthYears: string;
  readonly condition: string;
  /** Day 0 of days-from-baseline mode: the patient's earliest baseline day in the cohort. */
  readonly zeroDay: number;
  /** Whole days added to every date in shifted mode (0 otherwise). */
  readonly offsetDays: number;
  /** urn:uuid of the patient's FHIR Patient resource. */
  readonly fhirUuid: string;
  /** The identity, in identified mode only. */
  readonly identity: Identity | null;
}

/** Everything the writers need to turn records into disclosed rows. */
export interface DisclosurePlan {
  readonly kind: Disclosure['kind'];
  readonly dateMode: DeidentifiedDates['kind'] | 'actual';
  readonly patients: ReadonlyMap<string, PatientView>;
  /** Label of an assessing clinician: `C-` + 12 hex of a keyed hash, or the display name when identified. */
  readonly clinicianLabel: (clinicianId: string) => string;
  /** urn:uuid for the n-th observation resource (n from 0), unrelated to record ids when de-identified. */
  readonly observationUuid: (n: number, observationId: string) => string;
}

/** The first day of the synthetic calendar FHIR dates use in days-from-baseline mode: 2000-01-01. */
export const SYNTHETIC_ANCHOR_DATE = '2000-01-01';
const SYNTHETIC_ANCHOR_DAY = dayOfDate(SYNTHETIC_ANCHOR_DATE);

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, '0'));
const hex = (bytes: Uint8Array, from: number, to: number) => {
  let out = '';
  for (let i = from; i < to; i++) out += HEX[bytes[i] as number];
  return out;
};

/** Formats 16 bytes as a UUID with the version-4 and RFC 9562 variant bits set (random-looking, no time). */
function uuidFromBytes(bytes: Uint8Array): string {
  const b = Uint8Array.from(bytes.subarray(0, 16));
  b[6] = 0x40 | ((b[6] as number) & 0x0f);
  b[8] = 0x80 | ((b[8] as number) & 0x3f);
  return `${hex(b, 0, 4)}-${hex(b, 4, 6)}-${hex(b, 6, 8)}-${hex(b, 8, 10)}-${hex(b, 10, 16)}`;
}

/** 5-year birth band, `1950-1954`: bands start at multiples of 5. */
export function birthYearBand(birthYear: number): string {
  const start = Math.floor(birthYear / 5) * 5;
  return `${start}-${start + 4}`;
}

/**
 * Prepares the disclosure of a cohort: per patient a label, birth band, day 0 and date offset; per
 * clinician a label; FHIR resource ids. De-identified labels are HMAC-SHA-256 (RFC 2104, FIPS 180-4)
 * under the per-export key, through Web Crypto (crypto.subtle, in browsers, workers and Node ≥ 20),
 * so the same patient gets the same label within one export and an unrelated one in the next.
 * Cost: one HMAC per patient and clinician. Throws CohortExportError for a key shorter than 32
 * bytes, a shift range below 1 day, an rng value outside [0, 1), or (identified) a patient without identity.
 */
export async function prepareDisclosure(cohort: Cohort, index: CohortIndex, disclosure: Disclosure): Promise<DisclosurePlan> {
  const zeroDays = new Map<string, number>();
  const assessorIds = new Set<string>();
  for (const pair of cohort.pairs) {
    const id = pair.series.patient.id;
    const day = pair.series.days[pair.baselineIndex] as number;
    const current = zeroDays.get(id);
    if (current === undefined || day < current) zeroDays.set(id, day);
    for (let i = pair.baselineIndex; i <= pair.lastIndex; i++) {
      const a = pair.series.assessments[i];
      if (a) assessorIds.add(a.assessorId);
    }
  }

  const patients = new Map<string, PatientView>();
  if (disclosure.kind === 'identified') {
    const identities = new Map(disclosure.identities.filter((i) => !i.deleted).map((i) => [i.patientId, i]));
    for (const id of cohort.patientIds) {
      const patient = index.patients.get(id);
      const identity = identities.get(id);
      if (!patient) continue;
      if (!identity) throw new CohortExportError('disclosure.identities', `no identity for patient ${patient.code}; an identified export needs every patient's identity`);
      patients.set(id, { label: patient.code, birthYears: String(patient.birthYear), condition: patient.condition, zeroDay: zeroDays.get(id) ?? 0, offsetDays: 0, fhirUuid: patient.id, identity });
    }
    return {
      kind: 'identified',
      dateMode: 'actual',
      patients,
      clinicianLabel: (cid) => index.clinicians.get(cid)?.displayName ?? cid,
      observationUuid: (_n, observationId) => observationId,
    };
  }

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
  const seen = new Set<string>();
  for (const id of cohort.patientIds) {
    const patient = index.patients.get(id);
    if (!patient) continue;
    const digest = await mac(`patient:${id}`);
    const label = `P-${hex(digest, 0, 8)}`;
    // 64-bit labels collide with probability ≈ n²/2^65; refuse rather than merge two people.
    if (seen.has(label)) throw new CohortExportError('disclosure.keyBytes', 'two patients got the same pseudonym; export again (a new key is drawn)');
    seen.add(label);
    let offsetDays = 0;
    if (dates.kind === 'shifted') {
      // Redraw 0: an unshifted patient would carry real dates.
      for (let attempt = 0; offsetDays === 0; attempt++) {
        const u = dates.rng();
        if (!(u >= 0 && u < 1)) throw new CohortExportError('disclosure.dates.rng', `returned ${u}, not a number in [0, 1)`);
        offsetDays = Math.floor(u * (2 * maxShift + 1)) - maxShift;
        if (attempt > 1000) throw new CohortExportError('disclosure.dates.rng', 'keeps returning the same value');
      }
    }
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

/** A disclosed day: days from the patient's day 0, a shifted date, or (identified) the real date. */
export function disclosedDay(plan: DisclosurePlan, view: PatientView, day: number): number | string {
  switch (plan.dateMode) {
    case 'days-from-baseline':
      return day - view.zeroDay;
    case 'shifted':
      return dateOfDay(day + view.offsetDays);
    case 'actual':
      return dateOfDay(day);
  }
}

/**
 * A FHIR dateTime for a disclosed day: in days-from-baseline mode the synthetic date 2000-01-01 +
 * days (FHIR needs a date; the bundle's meta tag says the dates are synthetic); a shifted date;
 * or the real instant when identified.
 */
export function fhirDateTime(plan: DisclosurePlan, view: PatientView, day: number, instant: string): string {
  switch (plan.dateMode) {
    case 'days-from-baseline':
      return dateOfDay(SYNTHETIC_ANCHOR_DAY + day - view.zeroDay);
    case 'shifted':
      return dateOfDay(day + view.offsetDays);
    case 'actual':
      return instant;
  }
}
