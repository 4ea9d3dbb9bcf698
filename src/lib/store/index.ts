// Public face of src/lib/store: other folders import only this file.
// IndexedDB through Dexie: versions and migrations, repositories with audit, the vault, backups.
export { liveQuery } from 'dexie';
export { StoreError, describeIssues, toStoreError, type StoreErrorCode, type StoreIssue } from './store-error';
export { openStore, type KinnoteStore, type OpenStoreOptions, type StoreClock, type StoreSettings } from './open-store';
export { CHANGED_ELSEWHERE, IdentityRepository, ObservationRepository, Repository, type EditOptions, type Input, type Patch, type PreparedChange, type WritableTable, type WriteOptions } from './repository';
export type { Actor, StoreContext } from './store-context';
export { tableRows, type TableRows } from './table-rows';
export type { AssessmentRow, EventRow, IdentityRow, Row, RowTables } from './rows';
export { SCHEMA_VERSIONS, LATEST_SCHEMA_VERSION, TEAM_BASES_TABLE, declareSchema, type SchemaVersion } from './schema';
export { Vault, type Timers, type VaultStatus } from './vault';
export { DEFAULT_KDF_ITERATIONS, sha256Hex, type SealedText } from './crypto-box';
export { canonicalJson } from './canonical-json';
export { base64ToBytes, base64ToFloat64, bytesToBase64, float64ToBase64 } from './base64';
export {
  BUNDLE_FORMAT,
  BUNDLE_FORMAT_VERSION,
  createBundle,
  serializeBundle,
  verifyBundle,
  type BackupBundle,
  type BundleHeader,
  type BundleScope,
  type BundleTables,
  type VerifiedBundle,
} from './backup-bundle';
export { ENCRYPTED_BUNDLE_FORMAT, decryptBundleText, encryptBundleText } from './encrypted-bundle';
export { exportBackup, exportBackupText, type ExportOptions } from './export-backup';
export { importBackup, readBackup, type MergeConflict, type MergeReport, type ReadBackupOptions, type TableCounts } from './import-backup';
export { checkReferences, type OutsideLookup } from './check-references';
export { requestPersistentStorage, storageUsage, type StorageManagerLike } from './storage-estimate';
// demo-caseload.ts is loaded on demand by its own path (not re-exported here: lint's onDemand list), so the demo generator stays
// out of the first screen's JavaScript: see DEVELOPERS.md, first-load budget.
export { CASELOAD_SUMMARIES_TABLE, type CaseloadPatient, type CaseloadSummaryRow } from './caseload-summaries';
export { saveAssessment, type AssessmentObservationInput, type AssessmentTraceInput } from './save-assessment';
export { amendAssessment, type AmendedObservation } from './amend-assessment';
export { readLocalState, writeLocalState } from './local-state';
export { moveStampsAheadOfTeamTime, rowsChangedSince, type MovedStamp } from './stamps-ahead';
export {
  PHONE_REANALYSIS_NOTICE,
  REANALYSIS_CHANGED_NOTE,
  REANALYSIS_FLAGGED_NOTE,
  dismissPhoneReanalysisNotice,
  phoneReanalysisPending,
  readPhoneReanalysisNotice,
  type PhoneReanalysisNotice,
  type ReanalyseRecording,
  type ReanalysisNoticeChange,
  type ReanalysisNoticeFlag,
  type RecordingReanalysis,
} from './phone-reanalysis';
// phone-reanalysis-run.ts (the schema-7 step) is imported by its own path, loaded only when pending.
export { setAssessmentDeleted } from './assessment-tombstone';
export {
  DRAFTS_TABLE,
  LEGACY_TAB_ID,
  discardDraft,
  draftId,
  draftsFor,
  moveLegacyDrafts,
  takeOverDraft,
  writeDraft,
  type DraftRow,
  type LegacyDraftStorage,
} from './drafts';
export {
  EXERCISE_PHOTOS_TABLE,
  exercisePhotoId,
  followExerciseOrder,
  photosOfProgramme,
  putExercisePhoto,
  removeExercisePhoto,
  replaceProgrammePhotos,
  type ExercisePhotoRow,
} from './exercise-photos';
export { amendEvent } from './amend-event';
export { type AmendedField, type Amendment, amendmentsOf } from './amendments';
export { demoBundle } from './demo-caseload';
export { streamBackup, type BackupProgress } from './backup-stream';
