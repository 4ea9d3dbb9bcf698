// pg_dump of a team database and the scan for protected values (the "server never sees a name" proof).
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { openPostgres } from '../../../src/server';

/** Debian's pg_dump of the newest installed PostgreSQL (the one .ci/throwaway-postgres.sh runs), or $PG_BIN's. */
function pgDumpPath(): string {
  if (process.env.PG_BIN) return `${process.env.PG_BIN}/pg_dump`;
  const versions = readdirSync('/usr/lib/postgresql').sort((a, b) => Number(a) - Number(b));
  return `/usr/lib/postgresql/${versions[versions.length - 1]}/bin/pg_dump`;
}

/** The whole database `url` as pg_dump's plain SQL text. */
export function pgDump(url: string): string {
  return execFileSync(pgDumpPath(), ['--dbname', url, '--no-owner'], { encoding: 'utf8', maxBuffer: 512 * 1024 * 1024 });
}

/** The secrets found in a dump (case-insensitive). */
export function secretsIn(dump: string, secrets: readonly string[]): string[] {
  const text = dump.toLowerCase();
  return secrets.filter((s) => text.includes(s.toLowerCase()));
}

/** A new, empty database on the PostgreSQL server of `baseUrl`; returns its connection string. */
export async function newPostgresDatabase(baseUrl: string, prefix: string): Promise<string> {
  const name = `${prefix}_${randomBytes(6).toString('hex')}`;
  const admin = await openPostgres(baseUrl, 1);
  await admin.exec(`CREATE DATABASE ${name}`);
  await admin.close();
  const url = new URL(baseUrl);
  url.pathname = `/${name}`;
  return url.toString();
}
