import { readLocalState, writeLocalState, type KinnoteStore } from '../store';
import type { AdherenceEntry, HomeProgramme, SelfReport } from '../domain';
import { followedPlans } from './current-plans';
import { readDeviceProfile } from './device-profile';
import { readHomeLog, withTick, withoutTick, type ExerciseTick, type HomeLog } from './home-log';
import type { HomeReport } from './home-report';
import { adherenceByWeek, weeklyAdherence, type RecordedWeek } from './weekly-adherence';

const LOG_KEY = 'local:home-log';
/** AdherenceEntry allows at most 100 sessions (domain schema); a plan's week never has more than 50. */
const MAX_ENTRY_SESSIONS = 100;

/** The patient's tick log on this phone (empty when none; `damaged` when it could not be read). */
export async function loadHomeLog(store: KinnoteStore): Promise<{ log: HomeLog; damaged: boolean }> {
  return readHomeLog(await readLocalState(store, LOG_KEY));
}

/** The patient's programmes on this phone, as followed (see followedPlans). */
export async function loadFollowedPlans(store: KinnoteStore, patientId: string) {
  const profile = await readDeviceProfile(store);
  const receivedOn = profile?.mode === 'patient' ? profile.receivedOn : null;
  return followedPlans((await store.homeProgrammes.byPatient(patientId)) as HomeProgramme[], receivedOn);
}

/** The patient's recorded adherence, one entry a week (adherenceByWeek), as the therapist's screens show it. */
export async function recordedWeeksOf(store: KinnoteStore, patientId: string): Promise<RecordedWeek[]> {
  return adherenceByWeek((await store.adherenceEntries.byPatient(patientId)) as AdherenceEntry[]);
}

/** What a patient's phone holds, for the screen that asks before removing it. */
export async function patientPhoneContents(store: KinnoteStore, patientId: string | null): Promise<{ programmes: string[]; ticks: number; daysTicked: number; ratings: number }> {
  const { log } = await loadHomeLog(store);
  const programmes = patientId ? ((await store.homeProgrammes.byPatient(patientId)) as HomeProgramme[]).map((p) => p.title) : [];
  const ratings = patientId ? ((await store.selfReports.byPatient(patientId)) as SelfReport[]).length : 0;
  const days = new Set(log.ticks.filter((t) => t.status !== 'skipped').map((t) => t.day));
  return { programmes, ticks: log.ticks.length, daysTicked: days.size, ratings };
}

/**
 * Records a tick (or clears one when `tick.status` is null) and brings the weekly adherence
 * entries up to date, so that the audited records always match the ticks.
 */
export async function saveTick(
  store: KinnoteStore,
  patientId: string,
  tick: Omit<ExerciseTick, 'status'> & { status: ExerciseTick['status'] | null },
  today: string,
): Promise<HomeLog> {
  const { log } = await loadHomeLog(store);
  const next = tick.status === null ? withoutTick(log, tick) : withTick(log, tick as ExerciseTick);
  await writeLocalState(store, LOG_KEY, next);
  await syncWeeklyAdherence(store, patientId, next, today);
  return next;
}

/**
 * Creates or updates one AdherenceEntry per programme and week (periodStart = the Monday) from
 * the ticks, through `today`. An entry keeps its id for good, so each report carries the same ids
 * and the therapist's import replaces older copies instead of adding new ones. Weeks with nothing
 * planned get no entry. Returns the number of entries written.
 */
export async function syncWeeklyAdherence(store: KinnoteStore, patientId: string, log: HomeLog, today: string): Promise<number> {
  const plans = await loadFollowedPlans(store, patientId);
  const existing = (await store.adherenceEntries.byPatient(patientId)) as AdherenceEntry[];
  const byKey = new Map(existing.map((e) => [`${e.programmeId}|${e.periodStart}`, e]));
  let written = 0;
  for (const { programmeId, plan } of plans) {
    for (const week of weeklyAdherence(plan, programmeId, log.ticks, today)) {
      if (week.planned === 0) continue;
      const sessionsPlanned = Math.min(week.planned, MAX_ENTRY_SESSIONS);
      const sessionsDone = Math.min(week.done, sessionsPlanned);
      const current = byKey.get(`${programmeId}|${week.weekStart}`);
      if (!current) {
        await store.adherenceEntries.create({ patientId, programmeId, periodStart: week.weekStart, sessionsPlanned, sessionsDone, reportedBy: 'patient' });
        written++;
      } else if (current.sessionsPlanned !== sessionsPlanned || current.sessionsDone !== sessionsDone) {
        await store.adherenceEntries.update(current.id, { sessionsPlanned, sessionsDone }, { expectedUpdatedAt: current.updatedAt });
        written++;
      }
    }
  }
  return written;
}

/** The self-report of `day`, if any. */
export async function selfReportOn(store: KinnoteStore, patientId: string, day: string): Promise<SelfReport | undefined> {
  return ((await store.selfReports.byPatient(patientId)) as SelfReport[]).find((r) => r.reportedOn === day);
}

/** Saves today's spasm frequency (Penn 0–4) and severity (0–10): one SelfReport per day, updated in place. */
export async function saveSelfReport(store: KinnoteStore, patientId: string, day: string, penn: number | null, severity: number | null): Promise<SelfReport> {
  const current = await selfReportOn(store, patientId, day);
  if (current) return (await store.selfReports.update(current.id, { spasmFrequencyPenn: penn, spasmSeverityNrs: severity }, { expectedUpdatedAt: current.updatedAt })) as SelfReport;
  return (await store.selfReports.create({ patientId, reportedOn: day, spasmFrequencyPenn: penn, spasmSeverityNrs: severity, stiffnessNrs: null, painNrs: null })) as SelfReport;
}

/** Everything the phone sends back, read from the store (tombstones included, so deletions merge). */
export async function gatherHomeReport(
  store: KinnoteStore,
  binding: { patientId: string; patientCode: string; deviceId: string },
  today: string,
  exportedAt: string,
): Promise<Omit<HomeReport, 'format' | 'formatVersion'>> {
  const { log } = await loadHomeLog(store);
  await syncWeeklyAdherence(store, binding.patientId, log, today);
  const device = await store.devices.get(binding.deviceId);
  if (!device) throw new Error('this phone has no device record; accept a programme first');
  const plans = await loadFollowedPlans(store, binding.patientId);
  const followed = new Set(plans.map((p) => p.programmeId));
  return {
    exportedAt,
    patient: { id: binding.patientId, code: binding.patientCode },
    device,
    adherenceEntries: (await store.adherenceEntries.byPatient(binding.patientId, { includeDeleted: true })) as AdherenceEntry[],
    selfReports: (await store.selfReports.byPatient(binding.patientId, { includeDeleted: true })) as SelfReport[],
    ticks: log.ticks.filter((t) => followed.has(t.programmeId)),
  };
}
