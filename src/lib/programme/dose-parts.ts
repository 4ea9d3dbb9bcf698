import type { ExerciseDose } from '../domain';

/** One piece of a dose, for a screen to word in its own language. */
export type DosePart =
  | { readonly kind: 'hold'; readonly seconds: number }
  | { readonly kind: 'repetitions'; readonly count: number }
  | { readonly kind: 'sets'; readonly count: number }
  | { readonly kind: 'duration'; readonly minutes: number }
  | { readonly kind: 'overnight' }
  | { readonly kind: 'times-per-day'; readonly count: number }
  | { readonly kind: 'days-per-week'; readonly count: number }
  | { readonly kind: 'every-day' };

/**
 * The prescribed parts of a dose in reading order (hold, repetitions, sets, duration, overnight,
 * how often), without the note. Only what was prescribed appears; "every day" appears when times
 * a day was given without days a week, so the line never leaves the patient guessing the days.
 */
export function doseParts(dose: ExerciseDose): DosePart[] {
  const parts: DosePart[] = [];
  if (dose.holdSeconds !== null) parts.push({ kind: 'hold', seconds: dose.holdSeconds });
  if (dose.repetitions !== null) parts.push({ kind: 'repetitions', count: dose.repetitions });
  if (dose.sets !== null) parts.push({ kind: 'sets', count: dose.sets });
  if (dose.durationMinutes !== null) parts.push({ kind: 'duration', minutes: dose.durationMinutes });
  if (dose.overnight) parts.push({ kind: 'overnight' });
  if (dose.timesPerDay !== null && !(dose.overnight && dose.timesPerDay === 1)) parts.push({ kind: 'times-per-day', count: dose.timesPerDay });
  if (dose.daysPerWeek !== null && dose.daysPerWeek < 7) parts.push({ kind: 'days-per-week', count: dose.daysPerWeek });
  else if (dose.daysPerWeek === 7 || (dose.timesPerDay !== null && !dose.overnight)) parts.push({ kind: 'every-day' });
  return parts;
}

/** A duration in minutes as words: "45 min", "2 h", "1 h 30 min". */
export function durationWords(minutes: number, hourUnit = 'h', minuteUnit = 'min'): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  if (h === 0) return `${m} ${minuteUnit}`;
  return m === 0 ? `${h} ${hourUnit}` : `${h} ${hourUnit} ${m} ${minuteUnit}`;
}
