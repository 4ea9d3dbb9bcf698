import { generateDemoScenario, type DemoOptions } from '../demo';
import { BUNDLE_FORMAT, BUNDLE_FORMAT_VERSION, createBundle, type BackupBundle } from './backup-bundle';
import { importBackup, type MergeReport } from './import-backup';
import type { KinnoteStore } from './open-store';
import { LATEST_SCHEMA_VERSION } from './schema';

/**
 * The demo scenario as an unencrypted backup bundle. It carries invented identities and notes in
 * clear (protectedContent 'included'): they are fictional, and the app loads them into its vault.
 * Same options → byte-identical bundle.
 */
export async function demoBundle(options: DemoOptions): Promise<BackupBundle> {
  const scenario = generateDemoScenario(options);
  return createBundle(scenario.tables, {
    format: BUNDLE_FORMAT,
    formatVersion: BUNDLE_FORMAT_VERSION,
    schemaVersion: LATEST_SCHEMA_VERSION,
    exportedAt: scenario.endAt,
    exportedBy: null,
    source: `kinnote demo, seed ${options.seed}, invented data`,
    scope: { kind: 'all' },
    protectedContent: 'included',
  });
}

/**
 * Loads the invented demo caseload into a store through the ordinary import (so it validates,
 * merges and audits like any backup). Needs an actor and an unlocked vault (it carries invented
 * names and notes). Loading the same seed twice changes nothing.
 */
export async function loadDemoCaseload(store: KinnoteStore, options: DemoOptions): Promise<MergeReport> {
  return importBackup(store, await demoBundle(options));
}
