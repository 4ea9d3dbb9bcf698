import type { ReportAdherence, ReportAdherenceWeek } from './referral-report';
import { plural } from './report-value-text';

const dayMs = 86_400_000;

function addDays(day: string, days: number): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + days * dayMs).toISOString().slice(0, 10);
}

function percent(share: number): string {
  return `${Math.round(share * 100)} %`;
}

/**
 * Step 5 of referralReport: home-programme adherence over the weeks that touch [fromDay, throughDay]
 * (sessions done in full of those planned, and the weekly range); null when no week does.
 */
export function reportAdherence(weeksHeld: readonly ReportAdherenceWeek[], fromDay: string, throughDay: string): ReportAdherence | null {
  const weeks = weeksHeld
    .filter((w) => w.weekStart <= throughDay && addDays(w.weekStart, 6) >= fromDay)
    .sort((a, b) => (a.weekStart < b.weekStart ? -1 : 1))
    .map((w) => ({ weekStart: w.weekStart, planned: w.planned, done: w.done, share: w.planned > 0 ? w.done / w.planned : Number.NaN }));
  if (weeks.length === 0) return null;
  const planned = weeks.reduce((sum, w) => sum + w.planned, 0);
  const done = weeks.reduce((sum, w) => sum + w.done, 0);
  const share = planned > 0 ? done / planned : Number.NaN;
  const shares = weeks.filter((w) => w.planned > 0).map((w) => w.share);
  const range = shares.length > 1 ? `; weekly ${percent(Math.min(...shares))} to ${percent(Math.max(...shares))}` : '';
  return {
    weeks,
    planned,
    done,
    share,
    text:
      planned > 0
        ? `${done} of ${planned} planned exercise sessions done in full (${percent(share)}) over ${plural(weeks.length, 'week', 'weeks')}${range}.`
        : `No exercise sessions were planned in these ${plural(weeks.length, 'week', 'weeks')}.`,
  };
}
