// Public face of src/lib/workers: page-side clients of the Web Workers that run core modules.
export { analysePendulumFile, PendulumAnalysisError } from './analyse-pendulum-file';
export type { PendulumResult } from './pendulum-protocol';
export { startCohortExport } from './cohort-export-client';
export {
  CohortExportFailure,
  type CohortExportFileResult,
  type CohortExportJob,
} from './cohort-export-protocol';
export type { StreamedBackupJob } from './backup-stream-client';
