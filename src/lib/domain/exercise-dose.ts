import * as v from 'valibot';

/**
 * What is wrong with a dose, as a code and its values, so that each screen words it in its own
 * language (the therapist's catalogue, the patient's in English and Spanish). The schema's own
 * messages (`doseProblemText`) are the English of records checked away from a screen: a backup
 * import, the `kinnote` command.
 */
export type DoseProblem =
  | { readonly code: 'wholeNumber' }
  | { readonly code: 'atLeast'; readonly min: number }
  | { readonly code: 'atMost'; readonly max: number }
  | { readonly code: 'noteTooLong'; readonly max: number }
  | { readonly code: 'overnightOnceADay' }
  | { readonly code: 'nothingPrescribed' };

/** The fields of a dose, in the order a form shows them. */
export const DOSE_FIELDS = ['repetitions', 'sets', 'holdSeconds', 'durationMinutes', 'overnight', 'timesPerDay', 'daysPerWeek', 'note'] as const;
export type DoseField = (typeof DOSE_FIELDS)[number];

/** The English of a dose problem, as the schema reports it after the field's name. */
export function doseProblemText(p: DoseProblem): string {
  switch (p.code) {
    case 'wholeNumber':
      return 'must be a whole number';
    case 'atLeast':
      return `must be at least ${p.min}`;
    case 'atMost':
      return `must be at most ${p.max}`;
    case 'noteTooLong':
      return `must be at most ${p.max} characters`;
    case 'overnightOnceADay':
      return 'overnight is once a day: leave times a day empty or 1';
    case 'nothingPrescribed':
      return 'a dosage needs at least one value or a note';
  }
}

const WHOLE = doseProblemText({ code: 'wholeNumber' });
const count = (max: number) =>
  v.nullable(v.pipe(v.number(WHOLE), v.integer(WHOLE), v.minValue(1, doseProblemText({ code: 'atLeast', min: 1 })), v.maxValue(max, doseProblemText({ code: 'atMost', max }))));
/** A dose's fields as the schema's checks receive them (ExerciseDose before it is declared). */
type DoseValues = { readonly overnight: boolean; readonly note: string } & Readonly<Record<'repetitions' | 'sets' | 'holdSeconds' | 'durationMinutes' | 'timesPerDay' | 'daysPerWeek', number | null>>;
// Named, so that doseIssueOf knows a check's issue by its requirement (valibot keeps the function).
const overnightOnceADay = (d: DoseValues) => !d.overnight || d.timesPerDay === null || d.timesPerDay === 1;
const somethingPrescribed = (d: DoseValues) => d.overnight || d.note !== '' || [d.repetitions, d.sets, d.holdSeconds, d.durationMinutes, d.timesPerDay, d.daysPerWeek].some((x) => x !== null);

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
    note: v.pipe(v.string(), v.trim(), v.maxLength(MAX_DOSE_NOTE_LENGTH, doseProblemText({ code: 'noteTooLong', max: MAX_DOSE_NOTE_LENGTH }))),
  }),
  v.forward(v.check(overnightOnceADay, doseProblemText({ code: 'overnightOnceADay' })), ['timesPerDay']),
  v.check(somethingPrescribed, doseProblemText({ code: 'nothingPrescribed' })),
);

/** Where a dose problem is: the dose's own field, or null for the dose as a whole. */
export interface DoseIssue {
  readonly field: DoseField | null;
  readonly problem: DoseProblem;
}

const isDoseField = (key: unknown): key is DoseField => (DOSE_FIELDS as readonly unknown[]).includes(key);

/**
 * The dose problem behind one issue of a schema that holds ExerciseDoseSchema under a key `dose`
 * (or of ExerciseDoseSchema itself), or null when the issue is not the dose check's (another
 * field, or a value of the wrong shape: its English message then stands).
 */
export function doseIssueOf(issue: v.BaseIssue<unknown>): DoseIssue | null {
  const keys = (issue.path ?? []).map((p) => p.key);
  const at = keys.lastIndexOf('dose');
  const inside = at < 0 ? keys : keys.slice(at + 1);
  if (issue.type === 'check') {
    if (issue.requirement === overnightOnceADay) return { field: 'timesPerDay', problem: { code: 'overnightOnceADay' } };
    if (issue.requirement === somethingPrescribed) return { field: null, problem: { code: 'nothingPrescribed' } };
    return null;
  }
  // A field's own checks: the path ends at a dose field, right under `dose` (or at the top of a bare dose).
  const field = inside.length === 1 ? inside[0] : undefined;
  if ((at < 0 && keys.length !== 1) || !isDoseField(field)) return null;
  switch (issue.type) {
    case 'number':
    case 'integer':
      return field === 'note' || field === 'overnight' ? null : { field, problem: { code: 'wholeNumber' } };
    case 'min_value':
      return { field, problem: { code: 'atLeast', min: Number(issue.requirement) } };
    case 'max_value':
      return { field, problem: { code: 'atMost', max: Number(issue.requirement) } };
    case 'max_length':
      return { field, problem: { code: 'noteTooLong', max: Number(issue.requirement) } };
    default:
      return null;
  }
}
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
