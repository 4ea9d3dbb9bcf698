import { resolve } from 'node:path';
import { openTeamDatabase, startTeamServer } from '../../server';
import { parseOptions, RefusedInput, type CliCommand } from '../command';

const USAGE = `kinnote team-server [--port 8787] [--host 127.0.0.1] [--data DIR] [--enrol-limit 10]
kinnote team-server init --name "TEAM NAME" [--data DIR]

Starts the optional team server: an HTTP JSON API that keeps a team's devices in step. Storage is
embedded PostgreSQL (PGlite) in DIR (default ./kinnote-team-data), or the PostgreSQL server named by
the DATABASE_URL environment variable (15 or later). The schema is brought up to date on start.
\`init\` creates a team and prints its first admin's one-time enrolment code (valid 24 hours); with
PGlite, run it while the server is stopped (the data folder has one user at a time).`;

export const teamServerCommand: CliCommand = {
  name: 'team-server',
  summary: 'run the team server (PGlite in a folder, or PostgreSQL via DATABASE_URL); init creates a team',
  usage: USAGE,
  async run(args, io) {
    const { positional, values } = parseOptions(args, ['port', 'host', 'data', 'name', 'enrol-limit']);
    const location = { databaseUrl: io.env.DATABASE_URL || undefined, dataDir: resolve(io.cwd, values.get('data') ?? 'kinnote-team-data') };
    if (positional[0] === 'init') {
      const name = values.get('name');
      if (!name) throw new RefusedInput('init needs --name "TEAM NAME"');
      const db = await openTeamDatabase(location);
      try {
        const { TeamService } = await import('../../server');
        const team = await new TeamService(db).createTeam(name);
        io.stdout(JSON.stringify({ ...team, role: 'admin', note: 'give this code to the first admin; it works once' }, null, 2));
      } finally {
        await db.close();
      }
      return 0;
    }
    if (positional.length > 0) throw new RefusedInput(`unknown argument "${positional[0]}"; see kinnote team-server --help`);
    const portText = values.get('port') ?? '8787';
    if (!/^\d{1,5}$/.test(portText) || Number(portText) > 65535) throw new RefusedInput(`--port must be 0 to 65535, not "${portText}"`);
    const limitText = values.get('enrol-limit') ?? '10';
    if (!/^\d{1,6}$/.test(limitText) || Number(limitText) < 1) throw new RefusedInput(`--enrol-limit must be a whole number ≥ 1, not "${limitText}"`);
    const db = await openTeamDatabase(location);
    const server = await startTeamServer(db, { port: Number(portText), host: values.get('host') ?? '127.0.0.1', enrolLimit: Number(limitText) });
    io.stderr(`team server on ${server.url} (${db.kind === 'pglite' ? `PGlite in ${location.dataDir}` : 'PostgreSQL from DATABASE_URL'})`);
    io.stdout(JSON.stringify({ url: server.url, store: db.kind }));
    await new Promise<void>((done) => {
      const stop = () => {
        void server.close().then(() => db.close()).then(done);
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    });
    return 0;
  },
};
