import { readdir, readFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import type { SqlClient } from './sql-client';

const MIGRATIONS_DIR = fileURLToPath(new URL('./migrations/', import.meta.url));

/**
 * Brings the schema up to date on start: applies every `migrations/NNN-*.sql` not yet recorded in
 * schema_migrations, in name order, each in its own transaction with its record. The same files serve
 * PGlite and PostgreSQL. Returns the names applied now.
 */
export async function migrate(db: SqlClient): Promise<string[]> {
  await db.exec('CREATE TABLE IF NOT EXISTS schema_migrations (name text PRIMARY KEY, applied_at timestamptz NOT NULL DEFAULT now())');
  const done = new Set((await db.query<{ name: string }>('SELECT name FROM schema_migrations')).map((r) => r.name));
  const files = (await readdir(MIGRATIONS_DIR)).filter((f) => /^\d{3}-[a-z0-9-]+\.sql$/.test(f)).sort();
  const applied: string[] = [];
  for (const file of files) {
    if (done.has(file)) continue;
    const sql = await readFile(MIGRATIONS_DIR + file, 'utf8');
    await db.transaction(async (tx) => {
      // Two servers starting at once: the second waits here and then finds the migration recorded.
      const again = await tx.query('INSERT INTO schema_migrations (name) VALUES ($1) ON CONFLICT DO NOTHING RETURNING name', [file]);
      if (again.length === 0) return;
      for (const statement of splitStatements(sql)) await tx.query(statement);
    });
    applied.push(file);
  }
  return applied;
}

/** Splits a migration file on semicolons at line ends (the files hold no functions or quoted semicolons). */
function splitStatements(sql: string): string[] {
  return sql
    .replace(/--[^\n]*/g, '')
    .split(/;\s*(?:\n|$)/)
    .map((s) => s.trim())
    .filter((s) => s !== '');
}
