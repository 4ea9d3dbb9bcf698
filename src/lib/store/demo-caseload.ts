import { DEMO_DRAWN_EXERCISE, calfStretchDrawing, generateDemoScenario, type DemoOptions, type LineDrawing } from '../demo';
import type { ExercisePhoto } from '../domain';
import { BUNDLE_FORMAT, BUNDLE_FORMAT_VERSION, createBundle, type BackupBundle } from './backup-bundle';
import { importBackup, type MergeReport } from './import-backup';
import type { KinnoteStore } from './open-store';
import { LATEST_SCHEMA_VERSION } from './schema';

/**
 * The demo scenario as an unencrypted backup bundle. It carries invented identities and notes in
 * clear (protectedContent 'included'): they are fictional, and the app loads them into its vault.
 * Same options → byte-identical bundle. With `paint` (the page's canvas), each demo programme's
 * calf stretch gets an invented line drawing as its photo (calfStretchDrawing), so a hand-over with
 * a photo can be shown from the demo; without it (Node), no photos.
 */
export async function demoBundle(options: DemoOptions, paint?: DrawingPainter): Promise<BackupBundle> {
  const scenario = generateDemoScenario(options);
  const photos: ExercisePhoto[] = [];
  const drawn = paint ? await paint(calfStretchDrawing()) : null;
  if (drawn) {
    for (const programme of scenario.tables.homeProgrammes) {
      const exercise = programme.items.findIndex((item) => item.name === DEMO_DRAWN_EXERCISE);
      if (exercise >= 0) photos.push({ ...drawn, programmeId: programme.id, patientId: programme.patientId, exercise, position: 1 });
    }
  }
  return createBundle(scenario.tables, {
    format: BUNDLE_FORMAT,
    formatVersion: BUNDLE_FORMAT_VERSION,
    schemaVersion: LATEST_SCHEMA_VERSION,
    exportedAt: scenario.endAt,
    exportedBy: null,
    source: `kinnote demo, seed ${options.seed}, invented data`,
    scope: { kind: 'all' },
    protectedContent: 'included',
  }, drawn ? photos : undefined);
}

/** Turns a line drawing into photo bytes (the page's canvas), or null where it cannot. */
export type DrawingPainter = (drawing: LineDrawing) => Promise<Pick<ExercisePhoto, 'type' | 'widthPx' | 'heightPx' | 'bytes'> | null>;

/**
 * Loads the invented demo caseload into a store through the ordinary import (so it validates,
 * merges and audits like any backup). Needs an actor and an unlocked vault (it carries invented
 * names and notes). Loading the same seed twice changes nothing.
 */
export async function loadDemoCaseload(store: KinnoteStore, options: DemoOptions, paint?: DrawingPainter): Promise<MergeReport> {
  return importBackup(store, await demoBundle(options, paint));
}
