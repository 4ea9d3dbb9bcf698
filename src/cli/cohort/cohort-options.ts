import { CONDITION_CATEGORIES, type EventKind } from '../../lib/domain';
import { COHORT_FILE_KINDS, type CohortCondition, type CohortFileKind, type CohortFilters, type CohortSetting, type CohortSide, type LocalMdc } from '../../lib/export';
import { optionDate, optionWholeNumber, parseOptions, RefusedInput } from '../command';

const VALUE_FLAGS = [
  'out',
  'from',
  'to',
  'condition',
  'event',
  'window-weeks',
  'window-days',
  'baseline-max-days',
  'measure',
  'site',
  'side',
  'setting',
  'clinician',
  'dates',
  'max-shift-days',
  'local-mdc',
  'files',
  'server',
] as const;

const list = (text: string | undefined): string[] => (text ?? '').split(',').map((s) => s.trim()).filter((s) => s !== '');

/** `6-12` → [6, 12]; refuses anything else. */
function range(text: string, flag: string): [number, number] {
  const m = /^(\d+)\s*[-–]\s*(\d+)$/.exec(text);
  if (!m) throw new RefusedInput(`--${flag} must be a range like 6-12, not "${text.slice(0, 40)}"`);
  const low = optionWholeNumber(m[1], flag, 0, 3650) as number;
  const high = optionWholeNumber(m[2], flag, 0, 3650) as number;
  if (high < low) throw new RefusedInput(`--${flag} ${text}: the end is before the start`);
  return [low, high];
}

/** `MEASURE[:SITE[:QUANTITY]]=VALUE@CITATION`, several separated by ";". */
function localMdcs(text: string | undefined): LocalMdc[] {
  if (!text) return [];
  return text.split(';').filter((s) => s.trim() !== '').map((item) => {
    const m = /^\s*([a-z0-9-]+)(?::([a-z0-9-]*))?(?::([a-z0-9-]+))?\s*=\s*([0-9.]+)\s*(?:@(.*))?$/.exec(item);
    if (!m) throw new RefusedInput(`--local-mdc: "${item}" is not MEASURE[:SITE[:QUANTITY]]=VALUE[@CITATION]`);
    const value = Number(m[4]);
    return { measureCode: m[1] as string, siteCode: m[2] ? m[2] : null, quantity: m[3] ?? null, value, citation: m[5]?.trim() || 'local reliability study (given on the command line)' };
  });
}

/** Builds the filters from the options; CohortExportError later checks codes against the catalogue. */
function filtersFrom(values: Map<string, string>): CohortFilters {
  const event = values.get('event');
  const weeks = values.get('window-weeks');
  const days = values.get('window-days');
  if ((weeks || days) && !event) throw new RefusedInput('--window-weeks/--window-days need --event KIND');
  if (weeks && days) throw new RefusedInput('give --window-weeks or --window-days, not both');
  let anchor: CohortFilters['anchor'] = null;
  if (event) {
    const [start, end] = weeks ? range(weeks, 'window-weeks').map((w) => w * 7) as [number, number] : days ? range(days, 'window-days') : [42, 84];
    anchor = { kind: event as EventKind, windowStartDay: start, windowEndDay: end, baselineMaxDaysBefore: optionWholeNumber(values.get('baseline-max-days'), 'baseline-max-days', 0, 3650) ?? null };
  }
  const conditions = list(values.get('condition'));
  for (const c of conditions) {
    if (!(CONDITION_CATEGORIES as readonly string[]).includes(c)) throw new RefusedInput(`--condition: "${c}" is not one of ${CONDITION_CATEGORIES.join(', ')}`);
  }
  return {
    fromDate: optionDate(values.get('from'), 'from') ?? null,
    toDate: optionDate(values.get('to'), 'to') ?? null,
    conditions: conditions as CohortCondition[],
    anchor,
    measureCode: values.get('measure') ?? null,
    siteCode: values.get('site') ?? null,
    side: (values.get('side') ?? null) as CohortSide | null,
    settings: list(values.get('setting')) as CohortSetting[],
    clinicianIds: list(values.get('clinician')),
  };
}

/** What `kinnote cohort` was asked for, checked. */
export interface CohortOptions {
  /** The team server's URL, or undefined for a backup file. */
  readonly server: string | undefined;
  /** The backup file, or the server URL (for messages). */
  readonly file: string;
  readonly outDir: string;
  readonly filters: CohortFilters;
  readonly datesMode: 'days' | 'shifted';
  readonly maxShiftDays: number | undefined;
  readonly fileKinds: readonly CohortFileKind[];
  readonly localMdc: readonly LocalMdc[];
  readonly identified: boolean;
}

/** Step 1 of `kinnote cohort`: reads and checks the arguments; RefusedInput names the flag at fault. */
export function cohortOptions(args: readonly string[]): CohortOptions {
  const { positional, values, switches } = parseOptions(args, VALUE_FLAGS, ['identified']);
  const server = values.get('server');
  if (server !== undefined ? positional.length !== 0 : positional.length !== 1) {
    throw new RefusedInput(server !== undefined ? 'give --server URL or a BACKUP.json, not both' : 'expected exactly one BACKUP.json argument');
  }
  const file = server ?? (positional[0] as string);
  const outDir = values.get('out');
  if (!outDir) throw new RefusedInput('--out DIR is required');
  const filters = filtersFrom(values);
  const datesMode = values.get('dates') ?? 'days';
  if (datesMode !== 'days' && datesMode !== 'shifted') throw new RefusedInput(`--dates must be days or shifted, not "${datesMode}"`);
  const maxShiftDays = optionWholeNumber(values.get('max-shift-days'), 'max-shift-days', 1, 3650);
  const fileKinds = list(values.get('files'));
  for (const kind of fileKinds) {
    if (!(COHORT_FILE_KINDS as readonly string[]).includes(kind)) throw new RefusedInput(`--files: "${kind}" is not one of ${COHORT_FILE_KINDS.join(', ')}`);
  }
  const localMdc = localMdcs(values.get('local-mdc'));
  return { server, file, outDir, filters, datesMode, maxShiftDays, fileKinds: fileKinds as CohortFileKind[], localMdc, identified: switches.has('identified') };
}
