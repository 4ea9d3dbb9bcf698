import { randomBytes, webcrypto } from 'node:crypto';
import { mkdir, readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { createInterface } from 'node:readline';
import { Writable } from 'node:stream';
import { CONDITION_CATEGORIES, type EventKind } from '../../lib/domain';
import {
  CohortExportError,
  COHORT_FILE_KINDS,
  prepareCohortExport,
  runCohortExport,
  type CohortCondition,
  type CohortFileKind,
  type CohortFilters,
  type CohortSetting,
  type CohortSide,
  type Disclosure,
  type LocalMdc,
} from '../../lib/export';
import { readBackup, StoreError } from '../../lib/store';
import { pullTeamSnapshot } from '../../lib/sync';
import { optionDate, optionWholeNumber, parseOptions, RefusedInput, type CliCommand, type CliIo } from '../command';
import { refuseFolder, StreamedOutputFile } from '../output-file';

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

/** Reads a passphrase from the terminal without echoing it. */
async function promptPassphrase(): Promise<string> {
  const muted = new Writable({ write: (_chunk, _encoding, done) => done() });
  process.stderr.write('Passphrase for the encrypted backup: ');
  const rl = createInterface({ input: process.stdin, output: muted, terminal: true });
  try {
    return await new Promise<string>((resolvePromise) => rl.question('', resolvePromise));
  } finally {
    rl.close();
    process.stderr.write('\n');
  }
}

async function passphraseFor(text: string, io: CliIo): Promise<string | undefined> {
  if (!text.includes('"kinnote-backup-encrypted"')) return undefined;
  const fromEnv = io.env.KINNOTE_PASSPHRASE;
  if (fromEnv !== undefined && fromEnv !== '') return fromEnv;
  if (process.stdin.isTTY && process.stderr.isTTY) return promptPassphrase();
  return undefined;
}

export const cohortCommand: CliCommand = {
  name: 'cohort',
  summary: 'de-identified cohort audit from a backup: long, wide and summary CSV and a FHIR R4 bundle',
  usage: [
    'kinnote cohort BACKUP.json --out DIR [filters] [--dates days|shifted] [--identified]',
    'kinnote cohort --server URL --out DIR [filters]   (the team server; device token in KINNOTE_TOKEN)',
    '',
    'Selects a cohort from a backup bundle and writes kinnote-cohort-long.csv (one row per observation),',
    'kinnote-cohort-wide.csv (baseline, follow-up, change, verdict per patient, measure, site and side),',
    'kinnote-cohort-summary.csv (n, median change and IQR, proportion improved beyond the MDC with its',
    'Wilson 95 % interval, Wilcoxon signed-rank p, SRM) and kinnote-cohort-fhir.json (HL7 FHIR R4 Bundle',
    'of Observations) into DIR. Prints a JSON summary on stdout.',
    '',
    'Filters: --from YYYY-MM-DD --to YYYY-MM-DD --condition stroke,... --measure CODE --site CODE',
    '  --side left|right|none --setting clinic,home,remote --clinician ID,...',
    '  --event KIND [--window-weeks 6-12 | --window-days 42-84] [--baseline-max-days N]: baseline = last',
    '  observation before the first such event in the date range, follow-up = first one in the window.',
    'MDC: the catalogue reference, or --local-mdc "MEASURE[:SITE[:QUANTITY]]=VALUE[@CITATION];..."',
    'Files: --files long,wide,summary,fhir (default all).',
    '',
    'De-identified by default: patient codes become keyed hashes under a random key that is never saved,',
    'dates become days from each patient\'s baseline (--dates days, FHIR dates then count from 2000-01-01)',
    'or are shifted by a random per-patient offset (--dates shifted [--max-shift-days 182]); birth years in',
    '5-year bands; no names, contact details or free text. --identified writes patient codes, names, dates',
    'of birth and real dates; it needs a backup with identities (an encrypted backup, decrypted here).',
    'Encrypted backups: passphrase from KINNOTE_PASSPHRASE, else a prompt on a terminal.',
    'Not a diagnostic device: decisions rest with licensed clinicians; follow local data-protection law.',
  ].join('\n'),
  async run(args, io) {
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

    let tables;
    let passphrase: string | undefined;
    try {
      if (server !== undefined) {
        // The team's records with a device token: no identities, no notes (as an auditor sees them).
        const token = io.env.KINNOTE_TOKEN;
        if (!token) throw new RefusedInput('--server needs a device token in KINNOTE_TOKEN');
        tables = (await pullTeamSnapshot(server, token, { fetch: globalThis.fetch, now: Date.now })).tables;
      } else {
        let text: string;
        try {
          text = await readFile(resolve(io.cwd, file), 'utf8');
        } catch (error) {
          throw new RefusedInput(`${file}: cannot read the file (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
        }
        passphrase = await passphraseFor(text, io);
        tables = (await readBackup(text, passphrase === undefined ? {} : { passphrase })).tables;
      }
    } catch (error) {
      if (error instanceof StoreError) {
        const hint = error.code === 'WrongPassphrase' && passphrase === undefined ? ' (set KINNOTE_PASSPHRASE)' : '';
        throw new RefusedInput(`${file}: ${error.message}${hint}`);
      }
      if ((error as Error).name === 'TeamSyncError') throw new RefusedInput(`${file}: ${(error as Error).message}`);
      throw error;
    }

    let disclosure: Disclosure;
    if (switches.has('identified')) {
      if (tables.identities.length === 0) throw new RefusedInput(`${file}: --identified needs a backup with identities; this one has none (protected content omitted)`);
      disclosure = { kind: 'identified', identities: tables.identities };
    } else {
      const uniform = () => {
        const words = webcrypto.getRandomValues(new Uint32Array(2));
        return ((words[0] as number) * 2 ** 21 + ((words[1] as number) >>> 11)) / 2 ** 53;
      };
      disclosure = {
        kind: 'deidentified',
        keyBytes: new Uint8Array(randomBytes(32)),
        dates: datesMode === 'shifted' ? { kind: 'shifted', rng: uniform, maxShiftDays } : { kind: 'days-from-baseline' },
      };
    }

    let prepared;
    try {
      prepared = await prepareCohortExport(tables, {
        filters,
        disclosure,
        localMdc,
        files: fileKinds.length > 0 ? (fileKinds as CohortFileKind[]) : undefined,
        now: new Date().toISOString(),
      });
    } catch (error) {
      if (error instanceof CohortExportError) throw new RefusedInput(`${file}: ${error.message}`);
      throw error;
    }

    const dir = resolve(io.cwd, outDir);
    try {
      await mkdir(dir, { recursive: true });
    } catch (error) {
      throw new RefusedInput(`${outDir}: cannot create the directory (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
    }
    if (disclosure.kind === 'identified') {
      io.stderr('kinnote cohort: warning: identified export: the files name patients (codes, names, dates of birth, real dates); keep them as protected health information');
    }
    const written: { file: string; kind: CohortFileKind; rows: number; characters: number }[] = [];
    // Every file goes to a temporary name first and is renamed into place only when all of them
    // were written: a full disk or a folder in the way leaves no partial file and no success report.
    for (const f of prepared.files) await refuseFolder(join(dir, f.fileName), join(outDir, f.fileName));
    const outputs: StreamedOutputFile[] = [];
    let current: StreamedOutputFile | null = null;
    let characters = 0;
    try {
      await runCohortExport(prepared, {
        onFileStart: (f) => {
          current = new StreamedOutputFile(join(dir, f.fileName), join(outDir, f.fileName));
          outputs.push(current);
          characters = 0;
        },
        onChunk: (_f, chunk) => {
          characters += chunk.length;
          return (current as StreamedOutputFile | null)!.write(chunk);
        },
        onFileEnd: (f) => {
          written.push({ file: join(dir, f.fileName), kind: f.kind, rows: f.rows, characters });
        },
      });
      for (const output of outputs) await output.commit();
    } catch (error) {
      for (const output of outputs) await output.discard();
      throw error;
    }
    const { cohort } = prepared;
    io.stdout(
      JSON.stringify(
        {
          backup: file,
          out: dir,
          disclosure:
            disclosure.kind === 'identified'
              ? { kind: 'identified' }
              : { kind: 'deidentified', dates: disclosure.dates.kind, keySaved: false, pseudonyms: 'HMAC-SHA-256 under a random per-export key' },
          count: { patients: cohort.patientIds.length, pairs: cohort.pairs.length, observations: cohort.observationCount },
          unlinkedObservations: prepared.index.unlinkedObservations,
          files: written,
          caution: 'Not a diagnostic device: decisions rest with licensed clinicians; follow local protocols and data-protection law.',
        },
        null,
        2,
      ),
    );
    return 0;
  },
};
