import type { Observation } from '$lib/domain';
import { latestVerdicts, mdcSourceLine, seriesKey, type ChangeVerdict, type LocalMdc } from '$lib/stats';
import { type ObservationDraft, describeValue } from '$lib/ui';

/** One test of the visit as the review before saving shows it: last time → today, and the verdict. */
export interface ReviewRow {
  readonly key: string;
  /** e.g. "Left knee extensors (quadriceps) · Modified Ashworth Scale". */
  readonly title: string;
  /** Last time's value and date ("1+ on 01/12/2026"), or null when this test is new. */
  readonly last: { readonly value: string; readonly date: string } | null;
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
 */
export function reviewRows(
  lastBySeries: ReadonlyMap<string, Observation>,
  today: readonly ObservationDraft[],
  context: { takenAt: string; clinicianId: string; localMdc?: readonly LocalMdc[] },
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
      ? 'First value of this test: nothing to compare yet'
      : refused
        ? `Not compared: ${refused}`
        : verdict
          ? mdcSourceLine(verdict.mdcUsed, unit, o.value.kind === 'ordinal')
          : 'Change not judged for this measure (no direction of improvement)';
    return {
      key,
      title: judged?.title ?? key,
      last: last ? { value: describeValue(last.value), date: new Date(last.takenAt).toLocaleDateString() } : null,
      today: describeValue(o.value),
      verdict,
      beyondMdc: verdict?.verdict === 'improved' || verdict?.verdict === 'worsened',
      mdcLine,
    };
  });
}
