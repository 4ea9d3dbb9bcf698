import type { Exercise } from './exercise-plan';

type Dosage = Omit<Exercise, 'name'>;

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const SEPARATOR = ' · ';

/**
 * The dosage of an exercise as one readable line, which is also the exact text kept in
 * HomeProgramme.items[].dosage (so any screen or export that shows the stored programme reads
 * naturally), e.g. "hold 30 s · 5 repetitions · 2 sets · 2 times a day · caution: stop if it hurts".
 * parseDosage reads it back losslessly. At most about 170 characters with a 100-character caution.
 */
export function formatDosage(d: Dosage): string {
  const parts: string[] = [];
  if (d.holdSeconds !== null) parts.push(`hold ${d.holdSeconds} s`);
  if (d.repetitions !== null) parts.push(plural(d.repetitions, 'repetition', 'repetitions'));
  if (d.sets !== null) parts.push(plural(d.sets, 'set', 'sets'));
  parts.push(`${plural(d.times, 'time', 'times')} a ${d.per}`);
  if (d.caution.trim() !== '') parts.push(`caution: ${d.caution.trim()}`);
  return parts.join(SEPARATOR);
}

const HOLD = /^hold (\d+) s$/;
const REPS = /^(\d+) repetitions?$/;
const SETS = /^(\d+) sets?$/;
const FREQUENCY = /^(\d+) times? a (day|week)$/;
const CAUTION = 'caution: ';

/**
 * Reads a dosage line written by formatDosage. Returns null for any other text (a programme
 * written elsewhere keeps its dosage as free text, shown as it is). Parts must come in the order
 * formatDosage writes them; the caution, last, may hold any text.
 */
export function parseDosage(text: string): Dosage | null {
  const cautionAt = text.indexOf(CAUTION);
  const head = cautionAt < 0 ? text : text.slice(0, Math.max(0, cautionAt - SEPARATOR.length));
  if (cautionAt > 0 && text.slice(cautionAt - SEPARATOR.length, cautionAt) !== SEPARATOR) return null;
  const caution = cautionAt < 0 ? '' : text.slice(cautionAt + CAUTION.length);
  const parts = head === '' ? [] : head.split(SEPARATOR);
  let i = 0;
  const take = (pattern: RegExp) => {
    const m = i < parts.length ? pattern.exec(parts[i]!) : null;
    if (m) i++;
    return m;
  };
  const hold = take(HOLD);
  const reps = take(REPS);
  const sets = take(SETS);
  const frequency = take(FREQUENCY);
  if (!frequency || i !== parts.length) return null;
  return {
    holdSeconds: hold ? Number(hold[1]) : null,
    repetitions: reps ? Number(reps[1]) : null,
    sets: sets ? Number(sets[1]) : null,
    times: Number(frequency[1]),
    per: frequency[2] as 'day' | 'week',
    caution,
  };
}
