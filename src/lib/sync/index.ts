// Public face of src/lib/sync: the team-server protocol shared by the app, the CLI and the server.
export { CODE_AUTH_LENGTH, CODE_KEY_LENGTH, formatEnrolmentCode, newEnrolmentCode, parseEnrolmentCode, type EnrolmentCode } from './enrolment-code';
export { SealedSchema, WIRE_SEALED_FIELDS, checkWireRecord, wireAad, type WireRecord } from './wire-record';
export { TEAM_KEY_BYTES, WRAP_ITERATIONS, importTeamKey, newTeamKey, openWithTeamKey, sealWithTeamKey, unwrapTeamKey, wrapTeamKey, type TeamKey } from './team-key';
export { fromWire, toWire } from './wire-codec';
export { TeamSyncError, countWaiting, isRevoked, issueEnrolmentCode, listTeamDevices, revokeTeamDevice, type TeamDevice, joinTeam, leaveTeam, readTeamLink, syncNow, type SyncDeps, type SyncReport, type TeamLink, type TeamRole } from './team-sync';
export { pullTeamSnapshot } from './team-snapshot';
export { OFFSET_TOLERANCE_MS, SERVER_TIME_HEADER, measureOffset } from './clock-offset';
