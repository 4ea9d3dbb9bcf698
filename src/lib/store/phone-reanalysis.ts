import { validateRecord, type AuditEntry, type Observation, type ObservationValue, type Trace } from '../domain';
import type { KinnoteStore } from './open-store';
import { auditSnapshot } from './rows';
import { auditEntry, nextTimestamp } from './store-context';
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

interface Marker {
  readonly doneTraceIds: string[];
}

const EMPTY_NOTICE: PhoneReanalysisNotice = { recordings: 0, recordingsChanged: 0, changes: [], flagged: [], dismissed: false };

/**
 * Runs the schema-7 re-analysis if the upgrade left it pending; returns the notice to show (null when
 * nothing was pending or no phone recording was found). For every `pendulum-knee-angle` trace that
 * holds the raw device-motion channels, tombstoned or not (a restored visit must not bring back old
 * numbers):
 * - a changed value: the observation is updated, with one audit entry (before, after, note
 *   `REANALYSIS_CHANGED_NOTE`); the trace's derived `knee_flexion_deg` is replaced by the corrected
 *   angle (audited too); the raw channels are never touched;
 * - a measure the older analysis left out (e.g. its R2 was out of range): created, audited;
 * - a recording the corrected analysis refuses, or a value it no longer yields: the saved values are
 *   kept and each gets an audit entry with the reason (`REANALYSIS_FLAGGED_NOTE`), and the notice
 *   lists it;
 * - an observation edited since it was read (another tab) is left alone.
 * Needs the device's actor (audit entries name who); without one the marker stays pending.
 * Throws StoreError when the database refuses a write; what was written before stays consistent.
 */
export async function runPendingPhoneReanalysis(store: KinnoteStore, reanalyse: ReanalyseRecording): Promise<PhoneReanalysisNotice | null> {
  const db = store.db;
  const meta = db.table<{ key: string; value: unknown }, string>('meta');
  let marker: Marker | undefined;
  try {
    marker = (await meta.get(PHONE_REANALYSIS_MARKER))?.value as Marker | undefined;
  } catch (error) {
    throw toStoreError(error, 'reading the re-analysis marker');
  }
  if (!marker) return null;
  if (!store.actor) return null;
  const traceIds: string[] = [];
  await db
    .table<Trace, string>('traces')
    .filter((t) => t.kind === 'pendulum-knee-angle')
    .each((t) => {
      traceIds.push(t.id);
    });
  for (const traceId of traceIds) {
    if (marker.doneTraceIds.includes(traceId)) continue;
    const trace = await db.table<Trace, string>('traces').get(traceId);
    if (!trace) continue;
    const observations = (await db.table<Observation, string>('observations').where('patientId').equals(trace.patientId).toArray()).filter((o) => o.traceId === traceId);
    let outcome: RecordingReanalysis;
    try {
      outcome = reanalyse(trace, observations);
    } catch (error) {
      // A bug in the analysis must not stop the app or the other recordings: flag this one.
      outcome = { kind: 'refused', reason: `the re-analysis failed (${error instanceof Error ? error.message : String(error)})` };
    }
    const patient = (await db.table('patients').get(trace.patientId)) as { code?: string } | undefined;
    await writeOne(store, trace, observations, outcome, patient?.code ?? '?');
    marker = ((await meta.get(PHONE_REANALYSIS_MARKER))?.value as Marker | undefined) ?? { doneTraceIds: [...marker.doneTraceIds, traceId] };
  }
  let notice: PhoneReanalysisNotice | undefined;
  try {
    notice = await db.transaction('rw', ['meta'], async () => {
      await meta.delete(PHONE_REANALYSIS_MARKER);
      return (await meta.get(PHONE_REANALYSIS_NOTICE))?.value as PhoneReanalysisNotice | undefined;
    });
  } catch (error) {
    throw toStoreError(error, 'finishing the re-analysis of saved phone recordings');
  }
  return notice ?? null;
}

/** Writes one recording's result in one transaction (see runPendingPhoneReanalysis). */
async function writeOne(store: KinnoteStore, trace: Trace, observations: readonly Observation[], outcome: RecordingReanalysis, patientCode: string): Promise<void> {
  const ctx = store.context;
  const db = store.db;
  const meta = db.table<{ key: string; value: unknown }, string>('meta');
  const isPhone = outcome.kind !== 'not-a-phone-recording';
  const updates: Observation[] = [];
  const audits: AuditEntry[] = [];
  const changes: ReanalysisNoticeChange[] = [];
  const flagged: ReanalysisNoticeFlag[] = [];
  const where = { patientId: trace.patientId, patientCode, takenAt: observations[0]?.takenAt ?? trace.startedAt };
  const flag = (kept: readonly Observation[], reason: string) => {
    if (kept.length === 0) return;
    const at = nextTimestamp(ctx);
    for (const o of kept) {
      const snapshot = auditSnapshot('observations', o as never);
      audits.push(auditEntry(ctx, at, 'update', 'observations', o.id, snapshot, snapshot, `${REANALYSIS_FLAGGED_NOTE} ${reason}`));
    }
    flagged.push({ ...where, measureCodes: kept.map((o) => o.measureCode), reason });
  };
  let newTrace: Trace | null = null;
  let added: Observation[] = [];
  if (outcome.kind === 'refused') {
    flag(observations, outcome.reason);
  } else if (outcome.kind === 'analysed') {
    const lost: Observation[] = [];
    for (const change of outcome.changes) {
      const current = observations.find((o) => o.id === change.observationId);
      if (!current) continue;
      if (change.after === null) {
        lost.push(current);
        continue;
      }
      const at = nextTimestamp(ctx, current.updatedAt);
      const candidate = { ...current, value: change.after, updatedAt: at, deviceId: ctx.actor()!.deviceId, clinicianId: ctx.actor()!.clinicianId };
      const checked = validateRecord('observations', candidate);
      if (!checked.ok) {
        lost.push(current);
        continue;
      }
      updates.push(checked.record as Observation);
      audits.push(auditEntry(ctx, at, 'update', 'observations', current.id, auditSnapshot('observations', current as never), auditSnapshot('observations', checked.record as never), REANALYSIS_CHANGED_NOTE));
      changes.push({ ...where, measureCode: current.measureCode, before: current.value, after: change.after });
    }
    flag(lost, 'the corrected analysis gives no value for this measure within what the record accepts');
    const sibling = observations[0];
    if (sibling && outcome.added.length > 0) {
      const prepared = await store.observations.prepareCreate(
        outcome.added.map((a) => ({
          patientId: sibling.patientId,
          assessmentId: sibling.assessmentId,
          takenAt: sibling.takenAt,
          measureCode: a.measureCode,
          siteCode: sibling.siteCode,
          side: sibling.side,
          mode: sibling.mode,
          instrument: sibling.instrument,
          value: a.value,
          traceId: trace.id,
        })),
      );
      added = prepared.rows as Observation[];
      for (const entry of prepared.audits) audits.push({ ...entry, note: REANALYSIS_CHANGED_NOTE });
      for (const a of outcome.added) changes.push({ ...where, measureCode: a.measureCode, before: null, after: a.value });
    }
    const angle = trace.channels.findIndex((c) => c.name === outcome.angleChannel);
    const length = trace.channels[0]?.samples.length ?? 0;
    if (changes.length > 0 && angle >= 0 && outcome.angleDeg.length === length) {
      const at = nextTimestamp(ctx, trace.updatedAt);
      const channels = trace.channels.map((c, i) => (i === angle ? { ...c, samples: outcome.angleDeg.slice() } : c));
      const candidate = { ...trace, channels, updatedAt: at, deviceId: ctx.actor()!.deviceId, clinicianId: ctx.actor()!.clinicianId };
      const checked = validateRecord('traces', candidate);
      if (checked.ok) {
        newTrace = checked.record as Trace;
        audits.push(auditEntry(ctx, at, 'update', 'traces', trace.id, auditSnapshot('traces', trace as never), auditSnapshot('traces', newTrace as never), `${REANALYSIS_CHANGED_NOTE} The derived channel ${outcome.angleChannel} now holds the corrected angle; the raw channels are unchanged.`));
      }
    }
  }
  try {
    await db.transaction('rw', ['observations', 'traces', 'audit', 'meta'], async () => {
      const marker = (await meta.get(PHONE_REANALYSIS_MARKER))?.value as Marker | undefined;
      // Another tab finished this recording (or the whole step) first: nothing to write.
      if (!marker || marker.doneTraceIds.includes(trace.id)) return;
      const stale = new Set<string>();
      for (const o of observations) {
        const now = await db.table<Observation, string>('observations').get(o.id);
        if (!now || now.updatedAt !== o.updatedAt) stale.add(o.id);
      }
      const freshTrace = await db.table<Trace, string>('traces').get(trace.id);
      const writeTrace = newTrace !== null && freshTrace?.updatedAt === trace.updatedAt;
      const keptUpdates = updates.filter((o) => !stale.has(o.id));
      const keptAudits = audits.filter((a) => !(a.table === 'observations' && a.recordId !== null && stale.has(a.recordId)) && (a.table !== 'traces' || writeTrace));
      if (keptUpdates.length > 0) await db.table('observations').bulkPut(keptUpdates);
      if (added.length > 0) await db.table('observations').bulkAdd(added);
      if (writeTrace) await db.table('traces').put(newTrace!);
      if (keptAudits.length > 0) await db.table('audit').bulkAdd(keptAudits);
      await meta.put({ key: PHONE_REANALYSIS_MARKER, value: { doneTraceIds: [...marker.doneTraceIds, trace.id] } satisfies Marker });
      if (!isPhone) return;
      const staleCodes = new Set(observations.filter((o) => stale.has(o.id)).map((o) => o.measureCode));
      const notice = ((await meta.get(PHONE_REANALYSIS_NOTICE))?.value as PhoneReanalysisNotice | undefined) ?? EMPTY_NOTICE;
      const keptChanges = changes.filter((c) => c.before === null || !staleCodes.has(c.measureCode));
      const keptFlags = flagged.map((f) => ({ ...f, measureCodes: f.measureCodes.filter((m) => !staleCodes.has(m)) })).filter((f) => f.measureCodes.length > 0);
      await meta.put({
        key: PHONE_REANALYSIS_NOTICE,
        value: {
          recordings: notice.recordings + 1,
          recordingsChanged: notice.recordingsChanged + (keptChanges.length > 0 ? 1 : 0),
          changes: [...notice.changes, ...keptChanges],
          flagged: [...notice.flagged, ...keptFlags],
          dismissed: false,
        } satisfies PhoneReanalysisNotice,
      });
    });
  } catch (error) {
    throw toStoreError(error, `re-analysing the saved phone recording ${trace.id}`);
  }
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
