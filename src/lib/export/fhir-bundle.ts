import { findSite, type Measure, type Observation } from '../domain';
import { fhirDateTime, SYNTHETIC_ANCHOR_DATE, type DisclosurePlan, type PatientView } from './prepare-disclosure';
import { compileFilters, isExportedObservation, type Cohort } from './select-cohort';
import { ChunkBuilder, DEFAULT_CHUNK_CHARS, type TextChunk } from './text-chunk';

/*
 * Code systems of Kinnote's own. They are URNs in a "kinnote" namespace that belongs to no external
 * terminology: the codes are the measure catalogue's codes, not LOINC or SNOMED CT codes, and a
 * receiving system maps them if it needs to. Units use UCUM (http://unitsofmeasure.org), an
 * external standard whose codes ("deg", "1") are real.
 */
export const KINNOTE_MEASURE_SYSTEM = 'urn:kinnote:measure';
export const KINNOTE_SITE_SYSTEM = 'urn:kinnote:site';
export const KINNOTE_GRADE_SYSTEM_PREFIX = 'urn:kinnote:grade:';
export const KINNOTE_TARDIEU_PART_SYSTEM = 'urn:kinnote:tardieu-part';
const KINNOTE_METHOD_SYSTEM = 'urn:kinnote:method';
export const KINNOTE_EXPORT_TAG_SYSTEM = 'urn:kinnote:export';
const KINNOTE_LATERALITY_EXTENSION = 'urn:kinnote:extension:laterality';
export const KINNOTE_PSEUDONYM_SYSTEM = 'urn:kinnote:export-pseudonym';
const KINNOTE_PATIENT_CODE_SYSTEM = 'urn:kinnote:patient-code';
export const UCUM = 'http://unitsofmeasure.org';

interface Coding {
  readonly system: string;
  readonly code: string;
  readonly display?: string;
}

/** meta.tag codings that say what the export did to the data. */
function exportTags(plan: DisclosurePlan): Coding[] {
  if (plan.kind === 'identified') return [{ system: KINNOTE_EXPORT_TAG_SYSTEM, code: 'identified', display: 'Identified export: real names, dates of birth and dates' }];
  const tags: Coding[] = [{ system: KINNOTE_EXPORT_TAG_SYSTEM, code: 'deidentified', display: 'De-identified: keyed-hash pseudonyms, birth years in 5-year bands, no free text' }];
  if (plan.dateMode === 'days-from-baseline') {
    tags.push({
      system: KINNOTE_EXPORT_TAG_SYSTEM,
      code: 'synthetic-dates',
      display: `Dates are synthetic: ${SYNTHETIC_ANCHOR_DATE} plus the days since each patient's baseline; not real dates`,
    });
  } else {
    tags.push({ system: KINNOTE_EXPORT_TAG_SYSTEM, code: 'shifted-dates', display: 'Dates are shifted by a random number of days per patient; intervals within a patient are kept' });
  }
  return tags;
}

const quantity = (value: number, unit: string) => ({ value, unit, system: UCUM, code: unit });

function valueElements(measure: Measure, value: Observation['value']): Record<string, unknown> {
  switch (value.kind) {
    case 'ordinal':
      return {
        valueCodeableConcept: {
          coding: [{ system: `${KINNOTE_GRADE_SYSTEM_PREFIX}${measure.code}`, code: value.grade }],
          text: value.grade,
        },
      };
    case 'tardieu': {
      const part = (code: string, display: string) => ({ coding: [{ system: KINNOTE_TARDIEU_PART_SYSTEM, code, display }] });
      return {
        component: [
          { code: part('r1', 'R1: angle of catch at fast stretch'), valueQuantity: quantity(value.r1Deg, 'deg') },
          { code: part('r2', 'R2: passive range at slow stretch'), valueQuantity: quantity(value.r2Deg, 'deg') },
          { code: part('quality', 'Quality of muscle reaction (0–5)'), valueInteger: value.quality },
          { code: part('spasticity-angle', 'Spasticity angle R2 − R1'), valueQuantity: quantity(value.spasticityAngleDeg, 'deg') },
        ],
      };
    }
    case 'angle':
      return { valueQuantity: quantity(value.angleDeg, 'deg') };
    case 'index':
      // Unit "1" (UCUM unity) for a dimensionless ratio.
      return { valueQuantity: quantity(value.value, measure.unit) };
    case 'count':
    case 'rating':
      return { valueInteger: value.value };
  }
}

/** The FHIR R4 Observation for one observation (de-identified or identified per the plan). */
function fhirObservation(plan: DisclosurePlan, view: PatientView, measure: Measure, o: Observation, day: number, tags: readonly Coding[]): Record<string, unknown> {
  const site = findSite(measure, o.siteCode);
  const sideText = o.side === 'none' ? '' : `, ${o.side}`;
  const method = [o.mode, o.instrument].filter((x): x is NonNullable<typeof x> => x !== null);
  return {
    resourceType: 'Observation',
    meta: { tag: tags },
    ...(o.side === 'none' ? {} : { extension: [{ url: KINNOTE_LATERALITY_EXTENSION, valueCode: o.side }] }),
    status: 'final',
    code: { coding: [{ system: KINNOTE_MEASURE_SYSTEM, code: measure.code, display: measure.label }], text: measure.label },
    subject: { reference: `urn:uuid:${view.fhirUuid}` },
    effectiveDateTime: fhirDateTime(plan, view, day, o.takenAt),
    ...valueElements(measure, o.value),
    bodySite: { coding: [{ system: KINNOTE_SITE_SYSTEM, code: o.siteCode, display: site?.label ?? o.siteCode }], text: `${site?.label ?? o.siteCode}${sideText}` },
    ...(method.length > 0 ? { method: { coding: method.map((code) => ({ system: KINNOTE_METHOD_SYSTEM, code })), text: method.join(', ') } } : {}),
  };
}

function fhirPatient(plan: DisclosurePlan, view: PatientView, tags: readonly Coding[]): Record<string, unknown> {
  if (plan.kind === 'identified' && view.identity) {
    const identity = view.identity;
    return {
      resourceType: 'Patient',
      meta: { tag: tags },
      identifier: [{ system: KINNOTE_PATIENT_CODE_SYSTEM, value: view.label }],
      name: [{ family: identity.familyName, given: [identity.givenName] }],
      ...(identity.dateOfBirth ? { birthDate: identity.dateOfBirth } : {}),
    };
  }
  return { resourceType: 'Patient', meta: { tag: tags }, identifier: [{ system: KINNOTE_PSEUDONYM_SYSTEM, value: view.label }] };
}

/**
 * An HL7 FHIR R4 (4.0.1) Bundle of type "collection", as JSON text in chunks: one Patient per cohort
 * patient (de-identified: only the pseudonym as identifier), then one Observation per exported
 * observation (the rows of the long CSV), each entry with a unique `urn:uuid:` fullUrl and subject
 * referring to its Patient's fullUrl. Observation: status "final"; code from Kinnote's own code
 * system; effectiveDateTime (synthetic 2000-01-01 + days in days-from-baseline mode, tagged so in
 * meta.tag); valueQuantity with UCUM "deg" for angles and "1" for indices, valueInteger for
 * counts and ratings, valueCodeableConcept for ordinal grades, and component R1, R2, quality and
 * R2 − R1 for the Modified Tardieu Scale. `now` (ISO instant) sets Bundle.timestamp when given.
 * Streams: holds one resource at a time. Cost O(rows).
 */
export function* fhirBundleChunks(cohort: Cohort, plan: DisclosurePlan, options: { now?: string; chunkChars?: number } = {}): Generator<TextChunk> {
  const compiled = compileFilters(cohort.filters);
  const builder = new ChunkBuilder(options.chunkChars ?? DEFAULT_CHUNK_CHARS);
  const bundleTags = exportTags(plan);
  // Resources carry the same tags without the long displays, so one taken out of the bundle still says what it is.
  const tags = bundleTags.map(({ system, code }) => ({ system, code }));
  const head = { resourceType: 'Bundle', meta: { tag: bundleTags }, type: 'collection', ...(options.now ? { timestamp: options.now } : {}) };
  let separator = '';
  const opening = builder.add(`${JSON.stringify(head).slice(0, -1)},"entry":[`, 0);
  if (opening) yield opening;
  for (const id of cohort.patientIds) {
    const view = plan.patients.get(id);
    if (!view) continue;
    const entry = { fullUrl: `urn:uuid:${view.fhirUuid}`, resource: fhirPatient(plan, view, tags) };
    const chunk = builder.add(`${separator}\n${JSON.stringify(entry)}`, 1);
    separator = ',';
    if (chunk) yield chunk;
  }
  let n = 0;
  for (const pair of cohort.pairs) {
    const s = pair.series;
    const view = plan.patients.get(s.patient.id);
    if (!view) continue;
    for (let i = pair.baselineIndex; i <= pair.lastIndex; i++) {
      if (!isExportedObservation(pair, i, compiled)) continue;
      const o = s.observations[i] as Observation;
      const entry = { fullUrl: `urn:uuid:${plan.observationUuid(n++, o.id)}`, resource: fhirObservation(plan, view, s.measure, o, s.days[i] as number, tags) };
      const chunk = builder.add(`${separator}\n${JSON.stringify(entry)}`, 1);
      separator = ',';
      if (chunk) yield chunk;
    }
  }
  builder.add('\n]}\n', 0);
  yield builder.flush();
}
