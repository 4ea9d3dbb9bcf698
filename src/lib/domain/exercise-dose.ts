import * as v from 'valibot';

const count = (max: number) => v.nullable(v.pipe(v.number('must be a whole number'), v.integer('must be a whole number'), v.minValue(1, 'must be at least 1'), v.maxValue(max, `must be at most ${max}`)));

/** Most times a day one exercise can be asked for (a tick button per time on the patient's phone). */
export const MAX_TIMES_PER_DAY = 6;
export const MAX_DOSE_NOTE_LENGTH = 200;

/**
 * The dosage of one home exercise, position or orthosis as the therapist prescribes it. Every
 * field is optional (null = not prescribed); nothing is ever filled in for the therapist:
 * - repetitions, sets, holdSeconds: an exercise ("hold 30 s, 3 repetitions, 2 sets");
 * - durationMinutes: how long each time, for positioning or wearing ("2 hours a day" is 120 with
 *   timesPerDay 1; a standing frame for 30 minutes is 30);
 * - overnight: worn or held overnight (a resting splint); at most once a day;
 * - timesPerDay, daysPerWeek: how often; both absent means "how often" was not prescribed, and
 *   the phone then lets the patient tick it without counting it as planned;
 * - note: anything else in the therapist's words ("each side", "as tolerated").
 * At least one field or the note must say something.
 */
export const ExerciseDoseSchema = v.pipe(
  v.strictObject({
    repetitions: count(100),
    sets: count(20),
    holdSeconds: count(600),
    durationMinutes: count(720),
    overnight: v.boolean(),
    timesPerDay: count(MAX_TIMES_PER_DAY),
    daysPerWeek: count(7),
    note: v.pipe(v.string(), v.trim(), v.maxLength(MAX_DOSE_NOTE_LENGTH, `must be at most ${MAX_DOSE_NOTE_LENGTH} characters`)),
  }),
  v.forward(
    v.check((d) => !d.overnight || d.timesPerDay === null || d.timesPerDay === 1, 'overnight is once a day: leave times a day empty or 1'),
    ['timesPerDay'],
  ),
  v.check(
    (d) =>
      d.overnight || d.note !== '' || [d.repetitions, d.sets, d.holdSeconds, d.durationMinutes, d.timesPerDay, d.daysPerWeek].some((x) => x !== null),
    'a dosage needs at least one value or a note',
  ),
);
export type ExerciseDose = v.InferOutput<typeof ExerciseDoseSchema>;

/** A dose with nothing prescribed yet (the form's starting point; not valid on its own). */
export const EMPTY_DOSE: ExerciseDose = {
  repetitions: null,
  sets: null,
  holdSeconds: null,
  durationMinutes: null,
  overnight: false,
  timesPerDay: null,
  daysPerWeek: null,
  note: '',
};

const SEPARATOR = ' · ';
const HOLD = /^hold (\d+) s$/;
const REPS = /^(\d+) repetitions?$/;
const SETS = /^(\d+) sets?$/;
const FREQUENCY = /^(\d+) times? a (day|week)$/;
const CAUTION = 'caution: ';

/**
 * Reads a dosage line written by Kinnote before schema version 6 (e.g. "hold 30 s · 3 repetitions ·
 * 2 sets · 2 times a day · caution: stop if it hurts") into a structured dose: "n times a day"
 * becomes timesPerDay n every day, "n times a week" becomes once a day on n days a week, and the
 * caution becomes the note ("caution: …"). Any other text (free text written elsewhere, such as
 * "3 × 30 s each side") returns null: it is kept as written, never guessed.
 */
export function doseFromLegacyLine(text: string): ExerciseDose | null {
  const cautionAt = text.indexOf(CAUTION);
  if (cautionAt > 0 && text.slice(cautionAt - SEPARATOR.length, cautionAt) !== SEPARATOR) return null;
  const head = cautionAt < 0 ? text : text.slice(0, Math.max(0, cautionAt - SEPARATOR.length));
  const caution = cautionAt < 0 ? '' : text.slice(cautionAt + CAUTION.length).trim();
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
  const times = Number(frequency[1]);
  const dose: ExerciseDose = {
    ...EMPTY_DOSE,
    holdSeconds: hold ? Number(hold[1]) : null,
    repetitions: reps ? Number(reps[1]) : null,
    sets: sets ? Number(sets[1]) : null,
    timesPerDay: frequency[2] === 'day' ? times : 1,
    daysPerWeek: frequency[2] === 'day' ? 7 : times,
    note: caution === '' ? '' : `caution: ${caution}`,
  };
  // A line this parser accepts but the schema refuses (e.g. 9 times a day) stays free text.
  return v.is(ExerciseDoseSchema, dose) ? dose : null;
}
