import type { Identity } from '../domain';
import { dateOfDay, dayOfDate } from './calendar-day';
import type { CohortIndex } from './cohort-index';
import { deidentifiedDisclosure } from './deidentified-disclosure';
import { identifiedDisclosure } from './identified-disclosure';
import type { Cohort } from './select-cohort';

export { birthYearBand } from './deidentified-disclosure';

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

/**
 * Prepares the disclosure of a cohort: per patient a label, birth band, day 0 and date offset; per
 * clinician a label; FHIR resource ids. De-identified labels are HMAC-SHA-256 (RFC 2104, FIPS 180-4)
 * under the per-export key, through Web Crypto (crypto.subtle, in browsers, workers and Node ≥ 20),
 * so the same patient gets the same label within one export and an unrelated one in the next.
 * Steps: each patient's day 0 and the assessors, then identified-disclosure or deidentified-disclosure.
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
  return disclosure.kind === 'identified'
    ? identifiedDisclosure(cohort, index, disclosure.identities, zeroDays)
    : deidentifiedDisclosure(cohort, index, disclosure, zeroDays, assessorIds);
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
