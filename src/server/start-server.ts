import { serve, type ServerType } from '@hono/node-server';
import type { Context } from 'hono';
import { createApp, type AppOptions } from './app';
import { migrate } from './migrate';
import { openPglite, openPostgres, type SqlClient } from './sql-client';
import { TeamService } from './team-service';

export interface StoreLocation {
  /** A PostgreSQL connection string (DATABASE_URL); else PGlite in `dataDir`. */
  readonly databaseUrl?: string | undefined;
  /** PGlite data folder; undefined with no databaseUrl means in memory (tests). */
  readonly dataDir?: string | undefined;
}

/** Opens the store (PGlite or PostgreSQL) and brings its schema up to date. */
export async function openTeamDatabase(location: StoreLocation): Promise<SqlClient> {
  const db = location.databaseUrl ? await openPostgres(location.databaseUrl) : await openPglite(location.dataDir);
  try {
    await migrate(db);
  } catch (error) {
    await db.close();
    throw error;
  }
  return db;
}

/** Starts the API on host:port (port 0: a free one); resolves with its address once listening. */
export async function startTeamServer(
  db: SqlClient,
  options: { port: number; host: string } & AppOptions,
): Promise<{ url: string; service: TeamService; close: () => Promise<void> }> {
  const service = new TeamService(db);
  const app = createApp(service, {
    ...options,
    clientAddress: options.clientAddress ?? ((c: Context) => (c.env as { incoming?: { socket?: { remoteAddress?: string } } })?.incoming?.socket?.remoteAddress ?? 'unknown'),
  });
  let server: ServerType | undefined;
  const port = await new Promise<number>((resolve, reject) => {
    server = serve({ fetch: app.fetch, port: options.port, hostname: options.host }, (info) => resolve(info.port));
    server.once('error', reject);
  });
  return {
    url: `http://${options.host}:${port}`,
    service,
    close: () =>
      new Promise<void>((resolve) => {
        server!.close(() => resolve());
        // Idle keep-alive connections would hold close() open for their timeout.
        (server as { closeIdleConnections?: () => void }).closeIdleConnections?.();
      }),
  };
}
