import type { TableName } from './record-tables';

/** A field of one record kind that holds the id of a record of another table. */
export interface RecordReference {
  readonly field: string;
  readonly target: TableName;
  /** True when the field may be null (no reference). */
  readonly nullable: boolean;
  /** True when the field holds an array of ids. */
  readonly many?: boolean;
}

/**
 * Every id a record holds that must resolve to a record of a given table (the stamps deviceId and
 * clinicianId excepted: a phone stamps records with the therapist who issued its programme, and
 * that clinician need not travel with them). Audit entries refer through `table` + `recordId`,
 * which `referencedIds` handles. One list, read by the import checks.
 */
export const RECORD_REFERENCES: { readonly [K in TableName]: readonly RecordReference[] } = {
  clinicians: [],
  devices: [],
  patients: [],
  identities: [{ field: 'patientId', target: 'patients', nullable: false }],
  events: [{ field: 'patientId', target: 'patients', nullable: false }],
  assessments: [
    { field: 'patientId', target: 'patients', nullable: false },
    { field: 'assessorId', target: 'clinicians', nullable: false },
  ],
  traces: [
    { field: 'patientId', target: 'patients', nullable: false },
    { field: 'assessmentId', target: 'assessments', nullable: true },
  ],
  observations: [
    { field: 'patientId', target: 'patients', nullable: false },
    { field: 'assessmentId', target: 'assessments', nullable: false },
    { field: 'traceId', target: 'traces', nullable: true },
  ],
  homeProgrammes: [{ field: 'patientId', target: 'patients', nullable: false }],
  adherenceEntries: [
    { field: 'patientId', target: 'patients', nullable: false },
    { field: 'programmeId', target: 'homeProgrammes', nullable: false },
  ],
  selfReports: [{ field: 'patientId', target: 'patients', nullable: false }],
  reliabilityStudies: [{ field: 'raterIds', target: 'clinicians', nullable: false, many: true }],
  audit: [],
};

/**
 * The ids `record` of `table` refers to, with the field and target table of each. An audit entry
 * refers to `recordId` in its `table` (when that names a record table). Never throws.
 */
export function referencedIds(table: TableName, record: Readonly<Record<string, unknown>>, tableNames: readonly string[]): { field: string; target: TableName; id: string }[] {
  const out: { field: string; target: TableName; id: string }[] = [];
  if (table === 'audit') {
    const target = record.table;
    if (typeof target === 'string' && tableNames.includes(target) && typeof record.recordId === 'string') out.push({ field: 'recordId', target: target as TableName, id: record.recordId });
    return out;
  }
  for (const ref of RECORD_REFERENCES[table]) {
    const value = record[ref.field];
    if (ref.many && Array.isArray(value)) value.forEach((id, i) => typeof id === 'string' && out.push({ field: `${ref.field}.${i}`, target: ref.target, id }));
    else if (typeof value === 'string') out.push({ field: ref.field, target: ref.target, id: value });
  }
  return out;
}
