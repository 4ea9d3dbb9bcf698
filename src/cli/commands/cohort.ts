import { randomBytes } from 'node:crypto';
import { CohortExportError, disclosureFromRequest, prepareCohortExport, type Disclosure } from '../../lib/export';
import { RefusedInput, type CliCommand } from '../command';
import { cohortOptions } from '../cohort/cohort-options';
import { readCohortTables } from '../cohort/read-cohort-tables';
import { makeOutputFolder, writeCohortFiles } from '../cohort/write-cohort-files';

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
    const options = cohortOptions(args);
    const { file } = options;
    const tables = await readCohortTables(options, io);
    if (options.identified && tables.identities.length === 0) {
      throw new RefusedInput(`${file}: --identified needs a backup with identities; this one has none (protected content omitted)`);
    }
    const disclosure: Disclosure = disclosureFromRequest(
      options.identified ? { kind: 'identified', identities: tables.identities } : { kind: 'deidentified', dates: options.datesMode === 'shifted' ? 'shifted' : 'days-from-baseline', maxShiftDays: options.maxShiftDays },
      (length) => new Uint8Array(randomBytes(length)),
    );
    let prepared;
    try {
      prepared = await prepareCohortExport(tables, {
        filters: options.filters,
        disclosure,
        localMdc: options.localMdc,
        files: options.fileKinds.length > 0 ? options.fileKinds : undefined,
        now: new Date().toISOString(),
      });
    } catch (error) {
      if (error instanceof CohortExportError) throw new RefusedInput(`${file}: ${error.message}`);
      throw error;
    }
    const dir = await makeOutputFolder(io.cwd, options.outDir);
    if (disclosure.kind === 'identified') {
      io.stderr('kinnote cohort: warning: identified export: the files name patients (codes, names, dates of birth, real dates); keep them as protected health information');
    }
    const written = await writeCohortFiles(prepared, dir, options.outDir);
    const { cohort } = prepared;
    const summary = {
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
    };
    io.stdout(JSON.stringify(summary, null, 2));
    return 0;
  },
};
