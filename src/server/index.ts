// Public face of src/server: the optional team server (Node only).
export { createApp, type AppOptions } from './app';
export { migrate } from './migrate';
export { openPglite, openPostgres, type SqlClient, type SqlQueryable } from './sql-client';
export { openTeamDatabase, startTeamServer, type StoreLocation } from './start-server';
export { MAX_PULL_LIMIT, MAX_PUSH_RECORDS, ROLES, TeamServerError, TeamService, type Device, type PulledRecord, type PushResult, type Role } from './team-service';
