import * as v from 'valibot';
import { AdherenceEntrySchema } from './adherence-entry';
import { AssessmentSchema } from './assessment';
import { AuditEntrySchema } from './audit-entry';
import { checkAuditEntry } from './check-audit-entry';
import { checkObservation } from './check-observation';
import { ClinicianSchema } from './clinician';
import { DeviceSchema } from './device';
import { DomainValidationError, type ValidationIssue } from './domain-error';
import { EventSchema } from './event';
import { HomeProgrammeSchema } from './home-programme';
import { IdentitySchema } from './identity';
import { ObservationSchema, type Observation } from './observation';
import { PatientSchema } from './patient';
import { ReliabilityStudySchema } from './reliability-study';
import { SelfReportSchema } from './self-report';
import { TraceSchema } from './trace';
import type { AdherenceEntry } from './adherence-entry';
import type { Assessment } from './assessment';
import type { AuditEntry } from './audit-entry';
import type { Clinician } from './clinician';
import type { Device } from './device';
import type { ClinicalEvent } from './event';
import type { HomeProgramme } from './home-programme';
import type { Identity } from './identity';
import type { Patient } from './patient';
import type { ReliabilityStudy } from './reliability-study';
import type { SelfReport } from './self-report';
import type { Trace } from './trace';

/** Every kind of record, by the table that holds it (in clear, domain form). */
export interface RecordTables {
  patients: Patient;
  identities: Identity;
  clinicians: Clinician;
  devices: Device;
  events: ClinicalEvent;
  assessments: Assessment;
  observations: Observation;
  traces: Trace;
  homeProgrammes: HomeProgramme;
  adherenceEntries: AdherenceEntry;
  selfReports: SelfReport;
  reliabilityStudies: ReliabilityStudy;
  audit: AuditEntry;
}
export type TableName = keyof RecordTables;

/** Table names in the order a bundle lists them (referenced records before those that refer to them). */
export const TABLE_NAMES = [
  'clinicians',
  'devices',
  'patients',
  'identities',
  'events',
  'assessments',
  'traces',
  'observations',
  'homeProgrammes',
  'adherenceEntries',
  'selfReports',
  'reliabilityStudies',
  'audit',
] as const satisfies readonly TableName[];

/** Fields of each record kind that are protected free text (encrypted at rest, omitted from de-identified output). */
export const PROTECTED_TEXT_FIELDS: { readonly [K in TableName]?: readonly (keyof RecordTables[K] & string)[] } = {
  assessments: ['notes'],
  events: ['notes'],
};

const SCHEMAS: { readonly [K in TableName]: v.GenericSchema<unknown, RecordTables[K]> } = {
  patients: PatientSchema,
  identities: IdentitySchema,
  clinicians: ClinicianSchema,
  devices: DeviceSchema,
  events: EventSchema,
  assessments: AssessmentSchema,
  observations: ObservationSchema,
  traces: TraceSchema,
  homeProgrammes: HomeProgrammeSchema,
  adherenceEntries: AdherenceEntrySchema,
  selfReports: SelfReportSchema,
  reliabilityStudies: ReliabilityStudySchema,
  audit: AuditEntrySchema,
};

/** True when `name` is one of the record tables. */
export function isTableName(name: string): name is TableName {
  return Object.prototype.hasOwnProperty.call(SCHEMAS, name);
}

/**
 * Validates one record of `table`: its schema (valibot), createdAt not after updatedAt, then for
 * observations the measure catalogue and for audit entries their table name, snapshot size and the
 * absence of protected text (checkAuditEntry). Returns the issues, each with a dot path; never
 * throws. Cost: O(size of the record).
 *
 * @example
 * const result = validateRecord('observations', draft);
 * if (!result.ok) result.issues; // [{ path, message }, …]: each field at fault and why
 * else result.record; // the typed Observation
 */
export function validateRecord<K extends TableName>(
  table: K,
  value: unknown,
): { ok: true; record: RecordTables[K] } | { ok: false; issues: ValidationIssue[] } {
  const result = v.safeParse(SCHEMAS[table], value);
  if (!result.success) {
    return {
      ok: false,
      issues: result.issues.map((issue) => ({ path: v.getDotPath(issue) ?? '', message: issue.message })),
    };
  }
  const record = result.output as RecordTables[K];
  const issues: ValidationIssue[] = [];
  if (record.createdAt > record.updatedAt) issues.push({ path: 'updatedAt', message: `${record.updatedAt} is before createdAt ${record.createdAt}` });
  if (table === 'observations') issues.push(...checkObservation(record as Observation));
  if (table === 'audit') issues.push(...checkAuditEntry(record as AuditEntry, TABLE_NAMES, PROTECTED_TEXT_FIELDS as Record<string, readonly string[]>));
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, record };
}

/** Like validateRecord, but returns the record or throws DomainValidationError naming the table, id and fields. */
export function parseRecord<K extends TableName>(table: K, value: unknown): RecordTables[K] {
  const result = validateRecord(table, value);
  if (result.ok) return result.record;
  const id = typeof value === 'object' && value !== null && typeof (value as { id?: unknown }).id === 'string' ? (value as { id: string }).id : null;
  throw new DomainValidationError(table, id, result.issues);
}
