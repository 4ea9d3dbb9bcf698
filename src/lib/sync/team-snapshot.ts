import { TABLE_NAMES, type TableName } from '../domain';
import { BUNDLE_FORMAT, BUNDLE_FORMAT_VERSION, LATEST_SCHEMA_VERSION, createBundle, readBackup, type BundleTables, type VerifiedBundle } from '../store';
import { TeamSyncError } from './team-sync';
import { fromWire } from './wire-codec';
import type { WireRecord } from './wire-record';

/**
 * The whole team's records as a verified bundle without protected content (no identities, notes
 * null), pulled page by page with a device token: what the cohort tools read. Every record passes
 * the same verification as a backup import. Throws TeamSyncError for a refused token or an
 * unreachable server, StoreError for a record that fails verification.
 */
export async function pullTeamSnapshot(serverUrl: string, token: string, deps: { fetch: typeof fetch; now: () => number }): Promise<VerifiedBundle> {
  const tables = Object.fromEntries(TABLE_NAMES.map((t) => [t, [] as unknown[]])) as unknown as BundleTables;
  let cursor = 0;
  for (;;) {
    let response: Response;
    try {
      response = await deps.fetch(`${serverUrl.replace(/\/+$/, '')}/v1/pull?cursor=${cursor}&limit=2000`, { headers: { authorization: `Bearer ${token}` } });
    } catch (cause) {
      throw new TeamSyncError(`the team server at ${serverUrl} cannot be reached`, null, { cause });
    }
    const page = (await response.json().catch(() => ({}))) as { error?: string; records: { table: TableName; record: WireRecord }[]; cursor: number; more: boolean };
    if (!response.ok) throw new TeamSyncError(`team server: ${page.error ?? `HTTP ${response.status}`}`, response.status);
    for (const { table, record } of page.records) {
      if (table === 'identities') continue;
      (tables[table] as unknown[]).push(await fromWire(table, record, null));
    }
    cursor = page.cursor;
    if (!page.more) break;
  }
  const bundle = await createBundle(tables, {
    format: BUNDLE_FORMAT,
    formatVersion: BUNDLE_FORMAT_VERSION,
    schemaVersion: LATEST_SCHEMA_VERSION,
    exportedAt: new Date(deps.now()).toISOString(),
    exportedBy: null,
    source: `team server ${serverUrl}`,
    scope: { kind: 'all' },
    protectedContent: 'omitted',
  });
  return readBackup(bundle);
}
