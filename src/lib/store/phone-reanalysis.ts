import type { Observation, ObservationValue, Trace } from '../domain';
import type { KinnoteStore } from './open-store';
import { toStoreError } from './store-error';

/**
 * Schema version 7 (issue 13): saved phone pendulum recordings are analysed again with the corrected
 * code, which reads the rotation rates in the browsers' axis order and reconstructs a hand-held start.
 *
 * Why after the open, not inside the upgrade transaction: the upgrade only leaves a marker in meta
 * (`PHONE_REANALYSIS_MARKER`), and this step does the work once the database is open.
 * - An upgrade runs inside IndexedDB's versionchange transaction, which blocks every tab and the app's
 *   own open until it ends. If the analysis threw on one odd recording (a bug, a recording nobody
 *   foresaw), the whole upgrade would abort and the app could not open at all; here one recording
 *   that fails is flagged and the others go on.
 * - The audit entries need the device's clinician and the store's clock and id source, which
 *   `openStore` builds after the upgrade; the upgrade function gets only the transaction.
 * - The analysis lives in sensors and pendulum, above the store: the caller passes it in
 *   (`reanalyse`), so the store keeps depending on the domain only.
 * Each recording is written in its own transaction (changed observations, their audit entries, the
 * trace's derived angle, the marker's progress and the notice), so a crash half-way resumes where it
 * stopped and never writes a recording twice; two tabs running it at once skip what the other did.
 */
export const PHONE_REANALYSIS_MARKER = 'phoneReanalysis';
/** The one-time notice for the user (device-local; never in a backup). */
export const PHONE_REANALYSIS_NOTICE = 'local:phone-reanalysis';

/** The audit note on each value the re-analysis changed or added. */
export const REANALYSIS_CHANGED_NOTE =
  "Re-analysed from the saved raw phone samples (schema 7 update). The value before came from the older analysis, which read the rotation rates in the older axis order (alpha about the phone's z axis) and assumed the leg started straight; the browsers deliver alpha about x, beta about y, gamma about z, and the start is now read from gravity.";
/** The start of the audit note on each value kept but flagged; the reason follows. */
export const REANALYSIS_FLAGGED_NOTE =
  'Flagged by the schema 7 re-analysis: the value is kept as saved, but it came from the older analysis (older rotation axis order, start assumed straight) and the corrected analysis does not confirm it. Treat it as doubtful and repeat the test. Reason:';

/** What the corrected analysis says about one saved recording (sensors' `reanalyseSavedRecording` returns this). */
export type RecordingReanalysis =
  | { readonly kind: 'not-a-phone-recording' }
  | { readonly kind: 'refused'; readonly reason: string }
  | {
      readonly kind: 'analysed';
      readonly changes: ReadonlyArray<{ readonly observationId: string; readonly measureCode: string; readonly before: ObservationValue; readonly after: ObservationValue | null }>;
      readonly added: ReadonlyArray<{ readonly measureCode: string; readonly value: ObservationValue }>;
      readonly angleDeg: Float64Array;
      /** The trace channel that holds the derived angle (replaced by angleDeg when present). */
      readonly angleChannel: string;
    };

export type ReanalyseRecording = (trace: Trace, observations: readonly Observation[]) => RecordingReanalysis;

export interface ReanalysisNoticeChange {
  readonly patientId: string;
  readonly patientCode: string;
  readonly takenAt: string;
  readonly measureCode: string;
  /** null: the older analysis saved no value for this measure (it is added now). */
  readonly before: ObservationValue | null;
  readonly after: ObservationValue;
}

export interface ReanalysisNoticeFlag {
  readonly patientId: string;
  readonly patientCode: string;
  readonly takenAt: string;
  /** The measures whose saved values are kept but doubtful. */
  readonly measureCodes: string[];
  readonly reason: string;
}

export interface PhoneReanalysisNotice {
  /** Phone recordings analysed again. */
  readonly recordings: number;
  /** Recordings where at least one value changed or was added. */
  readonly recordingsChanged: number;
  readonly changes: ReanalysisNoticeChange[];
  readonly flagged: ReanalysisNoticeFlag[];
  /** Set when the user has read it; the notice is then never shown again. */
  readonly dismissed: boolean;
}

/** True while the schema-7 re-analysis waits to run (lets the page load the analysis code only then). */
export async function phoneReanalysisPending(store: KinnoteStore): Promise<boolean> {
  try {
    return (await store.db.table('meta').get(PHONE_REANALYSIS_MARKER)) !== undefined;
  } catch (error) {
    throw toStoreError(error, 'reading the re-analysis marker');
  }
}

/** The notice of the schema-7 re-analysis while the user has not dismissed it, else null. */
export async function readPhoneReanalysisNotice(store: KinnoteStore): Promise<PhoneReanalysisNotice | null> {
  try {
    const notice = (await store.db.table('meta').get(PHONE_REANALYSIS_NOTICE))?.value as PhoneReanalysisNotice | undefined;
    return notice && !notice.dismissed ? notice : null;
  } catch (error) {
    throw toStoreError(error, 'reading the re-analysis notice');
  }
}

/** Marks the notice read: it is never shown again (its content stays, for support). */
export async function dismissPhoneReanalysisNotice(store: KinnoteStore): Promise<void> {
  try {
    await store.db.transaction('rw', ['meta'], async () => {
      const row = (await store.db.table('meta').get(PHONE_REANALYSIS_NOTICE)) as { value: PhoneReanalysisNotice } | undefined;
      if (row) await store.db.table('meta').put({ key: PHONE_REANALYSIS_NOTICE, value: { ...row.value, dismissed: true } });
    });
  } catch (error) {
    throw toStoreError(error, 'saving that the re-analysis notice was read');
  }
}
