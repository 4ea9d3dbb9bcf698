import { validateRecord, type AuditEntry, type Observation, type Trace } from '../domain';
import type { KinnoteStore } from './open-store';
import {
  PHONE_REANALYSIS_MARKER,
  PHONE_REANALYSIS_NOTICE,
  REANALYSIS_CHANGED_NOTE,
  REANALYSIS_FLAGGED_NOTE,
  type PhoneReanalysisNotice,
  type ReanalyseRecording,
  type ReanalysisNoticeChange,
  type ReanalysisNoticeFlag,
  type RecordingReanalysis,
} from './phone-reanalysis';
import { auditSnapshot } from './rows';
import { auditEntry, nextTimestamp } from './store-context';
import { toStoreError } from './store-error';
import { observationRows } from './observation-rows';

// The schema-7 step itself (phone-reanalysis.ts says why it runs after the open). Imported by its
// own path, not through the store's index, so that it loads only on a device where the step is
// pending and stays out of the first screen's JavaScript (first-load budget).

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
    const observations = (await observationRows(db).ofPatient(trace.patientId)).filter((o) => o.traceId === traceId);
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
        const now = await observationRows(db).get(o.id);
        if (!now || now.updatedAt !== o.updatedAt) stale.add(o.id);
      }
      const freshTrace = await db.table<Trace, string>('traces').get(trace.id);
      const writeTrace = newTrace !== null && freshTrace?.updatedAt === trace.updatedAt;
      const keptUpdates = updates.filter((o) => !stale.has(o.id));
      const keptAudits = audits.filter((a) => !(a.table === 'observations' && a.recordId !== null && stale.has(a.recordId)) && (a.table !== 'traces' || writeTrace));
      await observationRows(db).put(keptUpdates);
      await observationRows(db).add(added);
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
