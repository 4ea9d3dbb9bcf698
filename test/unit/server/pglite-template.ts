// A migrated PGlite data folder made once per machine and copied for every test that needs a new
// database. Why: a new PGlite database runs initdb in WebAssembly, 35–45 s on the loaded 2-core
// machine here, while copying a made folder and opening it takes 7–10 s (and loading the same
// folder from a tar into memory 15–17 s); measured 2026-12-03 at load average 14–19. Kept in the
// system's temporary folder under a name that changes with the PGlite version and the migrations,
// so a stale template is never used.
import { createHash, randomBytes } from 'node:crypto';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { migrate, openPglite, type SqlClient } from '../../../src/server';

const ROOT = resolve(import.meta.dirname, '../../..');
const MIGRATIONS = join(ROOT, 'src/server/migrations');

function templateHome(): string {
  const version = (JSON.parse(readFileSync(join(ROOT, 'node_modules/@electric-sql/pglite/package.json'), 'utf8')) as { version: string }).version;
  const hash = createHash('sha256');
  for (const file of readdirSync(MIGRATIONS).sort()) hash.update(file).update(readFileSync(join(MIGRATIONS, file)));
  return join(tmpdir(), `kinnote-pglite-template-${version}-${hash.digest('hex').slice(0, 12)}`);
}

let made: Promise<string> | undefined;

/** The template data folder (closed, migrated); made on first use on this machine. */
export function pgliteTemplate(): Promise<string> {
  made ??= (async () => {
    const home = templateHome();
    if (existsSync(join(home, 'PG_VERSION'))) return home;
    // Made beside its final place and renamed into it, so a parallel test file never sees half a template.
    const work = `${home}.making-${process.pid}-${randomBytes(4).toString('hex')}`;
    mkdirSync(work, { recursive: true });
    const db = await openPglite(work);
    try {
      await migrate(db);
    } finally {
      await db.close();
    }
    try {
      renameSync(work, home);
    } catch {
      // Another test process made it first: use theirs.
      rmSync(work, { recursive: true, force: true });
    }
    return home;
  })();
  return made;
}

/** Fills `target` (a new or empty folder) with a new, migrated PGlite data folder. */
export async function newPgliteDataDir(target: string): Promise<void> {
  cpSync(await pgliteTemplate(), target, { recursive: true });
}

/** A new, migrated PGlite database in a temporary folder that is removed when it is closed. */
export async function openTemplatePglite(): Promise<SqlClient> {
  const dir = mkdtempSync(join(tmpdir(), 'kinnote-pglite-'));
  await newPgliteDataDir(dir);
  const db = await openPglite(dir);
  return {
    ...db,
    async close() {
      await db.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
