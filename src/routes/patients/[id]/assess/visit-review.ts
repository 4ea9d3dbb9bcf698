import type { Observation } from '$lib/domain';
import { latestVerdicts, mdcSourceLine, seriesKey, type ChangeVerdict, type LocalMdc } from '$lib/stats';
import { VISIT_MESSAGES as M, type ObservationDraft, describeValue, PENDULUM_PRIMARY, type VisitReading } from '$lib/ui';

/**
 * One value per instrument reading for the review (compared with last time like a form row): a
 * pendulum test's relaxation index R2 (else its first index kept), an inclinometer's angle. The
 * reading's other indices are saved with it all the same.
 */
export function readingsForReview(readings: readonly VisitReading[]): ObservationDraft[] {
  return readings.flatMap((r) => {
    const primary = r.observations.find((o) => o.measureCode === PENDULUM_PRIMARY) ?? r.observations[0];
    return primary ? [primary] : [];
  });
}

/** One test of the visit as the review before saving shows it: last time → today, and the verdict. */
export interface ReviewRow {
  readonly key: string;
  /** e.g. "Left knee extensors (quadriceps) · Modified Ashworth Scale". */
  readonly title: string;
  /** Last time's value and date ("1+ on 01/12/2026"), or null when this test is new. */
  readonly last: { readonly value: string; readonly date: string } | null;
  /** Last time in words: "1+ (01/12/2026)", "new test" (earlier visits, not this test) or "first visit" (none earlier). */
  readonly lastText: string;
  readonly today: string;
  /** The stats engine's verdict (chooseMdc + changeVerdict); null when there is nothing to compare or no direction. */
  readonly verdict: ChangeVerdict | null;
  /** True when the change is at least the MDC (verdict improved or worsened). */
  readonly beyondMdc: boolean;
  /** Where the MDC comes from, in plain words (mdcSourceLine), or why the change is not judged. */
  readonly mdcLine: string;
}

/**
 * What changed since last time for each test of today's visit, judged by the one outcome rule: each
 * test is put as a two-point series (last time, today) through latestVerdicts, i.e. the code a
 * patient's page runs (baseline = last time, MDC by chooseMdc on both observations' instruments and
 * assessors, verdict by changeVerdict). No second MDC rule lives here. `today` must be later than
 * every last value (a new visit, or an amendment whose "last time" was read from before it).
 * `firstVisit`: the patient has no visit before this one (new, or the one amended), said plainly
 * instead of "new test".
 */
export function reviewRows(
  lastBySeries: ReadonlyMap<string, Observation>,
  today: readonly ObservationDraft[],
  context: { takenAt: string; clinicianId: string; localMdc?: readonly LocalMdc[]; firstVisit?: boolean },
): ReviewRow[] {
  return today.map((o, i) => {
    const key = seriesKey(o);
    const last = lastBySeries.get(key);
    const todayObs = { ...(last ?? {}), ...o, id: `review-${i}`, assessmentId: `review-${i}`, takenAt: context.takenAt, clinicianId: context.clinicianId, deleted: false } as Observation;
    const series = [...(last ? [last] : []), todayObs];
    let judged: ReturnType<typeof latestVerdicts>[number] | undefined;
    let refused: string | null = null;
    try {
      judged = latestVerdicts(series, { baselineRule: { kind: 'first' }, ...(context.localMdc ? { localMdc: context.localMdc } : {}) })[0];
    } catch (error) {
      refused = error instanceof Error ? error.message : String(error);
    }
    const verdict = judged?.verdict ?? null;
    const unit = o.value.kind === 'ordinal' ? '' : o.value.kind === 'tardieu' || o.value.kind === 'angle' ? '°' : '';
    const mdcLine = !last
      ? context.firstVisit
        ? M.firstVisitCompare
        : M.firstValueCompare
      : refused
        ? M.notCompared(refused)
        : verdict
          ? mdcSourceLine(verdict.mdcUsed, unit, o.value.kind === 'ordinal', judged?.mdcNote ?? null)
          : M.notJudged;
    return {
      key,
      title: judged?.title ?? key,
      last: last ? { value: describeValue(last.value), date: new Date(last.takenAt).toLocaleDateString() } : null,
      lastText: last ? `${describeValue(last.value)} (${new Date(last.takenAt).toLocaleDateString()})` : context.firstVisit ? M.firstVisitShort : M.newTest,
      today: describeValue(o.value),
      verdict,
      beyondMdc: verdict?.verdict === 'improved' || verdict?.verdict === 'worsened',
      mdcLine,
    };
  });
}
