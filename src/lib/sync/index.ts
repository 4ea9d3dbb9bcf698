// Public face of src/lib/sync: the team-server protocol shared by the app, the CLI and the server.
export { checkWireRecord, type WireRecord } from './wire-record';
export { TeamSyncError, countWaiting, isRevoked, issueEnrolmentCode, listTeamDevices, revokeTeamDevice, type TeamDevice, joinTeam, leaveTeam, readTeamLink, syncNow, type TeamLink, type TeamRole } from './team-sync';
export { pullTeamSnapshot } from './team-snapshot';
export { SERVER_TIME_HEADER } from './clock-offset';
