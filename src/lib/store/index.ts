// Public face of src/lib/store: other folders import only this file.
// IndexedDB through Dexie: versions and migrations, repositories with audit, the vault, backups.
export { liveQuery } from 'dexie';
export { StoreError } from './store-error';
export { openStore, type KinnoteStore } from './open-store';
export { CHANGED_ELSEWHERE, type Input } from './repository';
export type { Actor } from './store-context';
export { tableRows } from './table-rows';
export { LATEST_SCHEMA_VERSION, TEAM_BASES_TABLE } from './schema';
export { type VaultStatus } from './vault';
export { canonicalJson } from './canonical-json';
export { base64ToBytes, base64ToFloat64, bytesToBase64, float64ToBase64 } from './base64';
export {
  BUNDLE_FORMAT,
  BUNDLE_FORMAT_VERSION,
  createBundle,
  serializeBundle,
  type BundleTables,
  type VerifiedBundle,
} from './backup-bundle';
export { decryptBundleText, encryptBundleText } from './encrypted-bundle';
export { exportBackupText } from './export-backup';
export { importBackup, readBackup, type MergeConflict, type MergeReport } from './import-backup';
export { requestPersistentStorage, storageUsage } from './storage-estimate';
// demo-caseload.ts is loaded on demand by its own path (not re-exported here: lint's onDemand list), so the demo generator stays
// out of the first screen's JavaScript: see DEVELOPERS.md, first-load budget.
export { type CaseloadPatient, type CaseloadSummaryRow } from './caseload-summaries';
export { saveAssessment, type AssessmentObservationInput, type AssessmentTraceInput } from './save-assessment';
export { amendAssessment } from './amend-assessment';
export { readLocalState, writeLocalState } from './local-state';
export { moveStampsAheadOfTeamTime, rowsChangedSince } from './stamps-ahead';
export {
  dismissPhoneReanalysisNotice,
  phoneReanalysisPending,
  readPhoneReanalysisNotice,
  type PhoneReanalysisNotice,
  type ReanalysisNoticeChange,
  type ReanalysisNoticeFlag,
} from './phone-reanalysis';
// phone-reanalysis-run.ts (the schema-7 step) is imported by its own path, loaded only when pending.
export { setAssessmentDeleted } from './assessment-tombstone';
export {
  discardDraft,
  draftsFor,
  moveLegacyDrafts,
  takeOverDraft,
  writeDraft,
  type DraftRow,
} from './drafts';
export {
  followExerciseOrder,
  photosOfProgramme,
  putExercisePhoto,
  removeExercisePhoto,
  type ExercisePhotoRow,
} from './exercise-photos';
export { amendEvent } from './amend-event';
export { type AmendedField, type Amendment, amendmentsOf } from './amendments';
export { demoBundle } from './demo-caseload';
export { streamBackup, type BackupProgress } from './backup-stream';
export { blobTextChunks, restoreBackupStream, type RestoreProgress } from './restore-stream-write';
