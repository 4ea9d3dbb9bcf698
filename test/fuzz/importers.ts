// Fuzz harnesses for every importer: pendulum CSV, motion CSV, reliability CSV, backup, programme
// hand-off and home report. Each case mutates a valid file with a seeded generator (nasty numbers,
// dates, ids, cuts, duplicated or dropped lines, byte-order marks, edited JSON re-signed or
// re-sealed so that the checks behind the checksum or the encryption are reached), runs the real
// import path and sorts the outcome: accepted, refused cleanly (the importer's own typed error),
// crashed (anything else), and for importers that write, partial writes (a refused import that
// changed the store). Used by test/unit/fuzz (a few hundred cases, fixed seed) and `npm run fuzz`.
import 'fake-indexeddb/auto';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { SeededRandom } from '../../src/lib/demo/seeded-random';
import { analysePendulumCsv, PendulumInputError } from '../../src/lib/pendulum';
import { analyseMotionRecording, MotionInputError, parseMotionCsv } from '../../src/lib/sensors';
import { anovaMeanSquares, completeSubjects, intraclassCorrelations, MissingCellError, readReliabilityCsv, StatsInputError } from '../../src/lib/stats';
import { canonicalJson, importBackup, openStore, StoreError, type KinnoteStore } from '../../src/lib/store';
import { exportBackup } from '../../src/lib/store/export-backup';
import { sha256Hex } from '../../src/lib/store/crypto-box';
import { acceptProgrammePackage, choosePatientMode, createProgrammePackage, importHomeReport, openProgrammePackage, planToProgrammeInput, ProgrammeTransferError, type ExercisePlan } from '../../src/lib/programme';
import { sealTransfer } from '../../src/lib/programme/sealed-transfer';
import { EARLIEST_TIMESTAMP, EMPTY_DOSE, MAX_CLOCK_SKEW_MS } from '../../src/lib/domain';
import { ordinalValue } from '../../src/lib/domain';

export interface FuzzCounts {
  tried: number;
  refused: number;
  accepted: number;
  crashed: number;
  partialWrites: number;
  /** Accepted imports after which the store broke an invariant (see `unsoundness`); backup only. */
  unsound: number;
  /** The first few crashes and unsound acceptances, for a person to read. */
  crashes: string[];
}

export const IMPORTER_NAMES = ['pendulum', 'motion', 'reliability', 'backup', 'programme', 'report'] as const;
export type ImporterName = (typeof IMPORTER_NAMES)[number];

export interface FuzzOptions {
  /** Importers to run (default: all). */
  readonly only?: readonly ImporterName[];
  /** The backup import under test (default: the real one); the self-check passes broken ones. */
  readonly importBackup?: (store: KinnoteStore, input: unknown) => Promise<unknown>;
}

const NASTY_TEXT = ['', '0x10', '1e400', '-1e400', 'NaN', 'Infinity', '-0', '9'.repeat(400), '"', '""', '\uFEFF', '\u0000', ',', ';', '1,5', '  ', '1e-400', '+.5', '0b11', '1_000', '١٢', '<script>', '=1+1'];
const NASTY_JSON: unknown[] = [null, -1, 0, 1e308, -1e308, 2 ** 53 + 1, 0.5, '', 'x'.repeat(300_000), '9999-12-31T23:59:59.999Z', '0001-01-01T00:00:00.000Z', '2025-02-30', '1999-12-31T23:59:59.999Z', {}, [], true, '019552a6-8680-7a91-9c13-2d3f058a576e', '[sealed]', { familyName: 'Fuzz' }];

const fixtures = join(process.cwd(), 'test', 'fixtures');

/** A text mutation: edit one field, a line, or the ends of the file. */
function mutateText(text: string, rng: SeededRandom): string {
  const lines = text.split(/\r?\n/);
  const pick = () => rng.int(0, lines.length - 1);
  const kind = rng.int(0, 7);
  if (kind === 0) return text.slice(0, rng.int(0, text.length));
  if (kind === 1) return `\uFEFF${text}`;
  if (kind === 2) {
    const i = pick();
    lines.splice(i, 0, lines[i] ?? '');
    return lines.join('\n');
  }
  if (kind === 3) {
    lines.splice(pick(), 1);
    return lines.join('\n');
  }
  if (kind === 4) {
    const at = rng.int(0, text.length);
    return text.slice(0, at) + String.fromCharCode(rng.int(0, 0x7f)) + text.slice(at + 1);
  }
  // Replace one to three fields with nasty tokens.
  for (let n = rng.int(1, 3); n > 0; n--) {
    const i = pick();
    const fields = (lines[i] ?? '').split(',');
    fields[rng.int(0, fields.length - 1)] = NASTY_TEXT[rng.int(0, NASTY_TEXT.length - 1)]!;
    lines[i] = fields.join(',');
  }
  return lines.join(kind === 5 ? '\r\n' : '\n');
}

/** A JSON mutation: one to three values somewhere in the tree replaced, removed or duplicated. */
function mutateJson(value: unknown, rng: SeededRandom): unknown {
  const copy = JSON.parse(JSON.stringify(value)) as unknown;
  for (let n = rng.int(1, 3); n > 0; n--) {
    let node = copy as Record<string, unknown>;
    for (let depth = 0; depth < 6; depth++) {
      const keys = Object.keys(node);
      if (keys.length === 0) break;
      const key = keys[rng.int(0, keys.length - 1)]!;
      const child = node[key];
      if (child !== null && typeof child === 'object' && rng.chance(0.7)) {
        node = child as Record<string, unknown>;
        continue;
      }
      const action = rng.int(0, 4);
      if (action === 0 && !Array.isArray(node)) delete node[key];
      else if (action === 1 && Array.isArray(node)) node.push(JSON.parse(JSON.stringify(node[Number(key)] ?? null)));
      else node[key] = JSON.parse(JSON.stringify(NASTY_JSON[rng.int(0, NASTY_JSON.length - 1)] ?? null));
      break;
    }
  }
  return copy;
}

const NASTY_STAMPS = ['9999-12-31T23:59:59.999Z', '2099-01-01T00:00:00.000Z', '1999-12-31T23:59:59.999Z', '1970-01-01T00:00:00.000Z'];

/**
 * A record-aware edit of a backup's tables: one field of one record that names another record (its
 * key ends in "Id") is pointed at an unknown id or at a record of another table, or one stamp (a key
 * ending in "At") moves far into the future or the past. These reach the reference and time checks,
 * which a blind edit seldom does (it must hit one field of one record with one of few values).
 */
function mutateRecords(tables: Record<string, unknown[]>, rng: SeededRandom): Record<string, unknown[]> {
  const copy = JSON.parse(JSON.stringify(tables)) as Record<string, Record<string, unknown>[]>;
  const filled = Object.keys(copy).filter((name) => (copy[name]?.length ?? 0) > 0);
  const rows = copy[filled[rng.int(0, filled.length - 1)]!]!;
  const row = rows[rng.int(0, rows.length - 1)]!;
  const refs = Object.keys(row).filter((k) => /Id$/.test(k) && typeof row[k] === 'string');
  const stamps = Object.keys(row).filter((k) => /At$/.test(k) && typeof row[k] === 'string');
  const allIds = Object.entries(copy).flatMap(([, list]) => list.map((r) => r.id)).filter((id): id is string => typeof id === 'string');
  if (refs.length > 0 && (stamps.length === 0 || rng.chance(0.5))) {
    const hex = () => rng.int(0, 0xffff).toString(16).padStart(4, '0');
    row[refs[rng.int(0, refs.length - 1)]!] = rng.chance(0.5) ? allIds[rng.int(0, allIds.length - 1)] : `${hex()}${hex()}-${hex()}-7${hex().slice(1)}-8${hex().slice(1)}-${hex()}${hex()}${hex()}`;
  } else if (stamps.length > 0) {
    row[stamps[rng.int(0, stamps.length - 1)]!] = NASTY_STAMPS[rng.int(0, NASTY_STAMPS.length - 1)];
  }
  return copy;
}

function record(counts: FuzzCounts, error: unknown, clean: boolean, label: string): void {
  if (clean) counts.refused++;
  else {
    counts.crashed++;
    if (counts.crashes.length < 5) counts.crashes.push(`${label}: ${(error as Error)?.stack?.split('\n').slice(0, 3).join(' | ') ?? String(error)}`);
  }
}

const newCounts = (): FuzzCounts => ({ tried: 0, refused: 0, accepted: 0, crashed: 0, partialWrites: 0, unsound: 0, crashes: [] });

async function textFuzz(cases: number, seed: number, base: string, run: (text: string) => void, isClean: (e: unknown) => boolean, label: string): Promise<FuzzCounts> {
  const rng = new SeededRandom(seed);
  const counts = newCounts();
  for (let i = 0; i < cases; i++) {
    const text = mutateText(base, rng);
    counts.tried++;
    try {
      run(text);
      counts.accepted++;
    } catch (error) {
      record(counts, error, isClean(error), `${label} case ${i}`);
    }
  }
  return counts;
}

/** Rows in every table: a refused import must leave them all as they were. */
async function fingerprint(store: KinnoteStore): Promise<string> {
  const parts: string[] = [];
  for (const table of store.db.tables) parts.push(`${table.name}:${await table.count()}`);
  return parts.join(',');
}

/**
 * What an accepted import must never leave behind, checked on the raw tables (not through the
 * importer's own checks): a record stamped outside [2000-01-01, the device's clock + the stated
 * skew] or created after its last update, or a patientId / assessmentId that resolves to nothing.
 */
async function unsoundness(store: KinnoteStore, nowMs: number): Promise<string[]> {
  const problems: string[] = [];
  const ids = async (name: string) => new Set((await store.db.table(name).toArray()).map((r: { id: string }) => r.id));
  const patients = await ids('patients');
  const assessments = await ids('assessments');
  const latest = new Date(nowMs + MAX_CLOCK_SKEW_MS).toISOString();
  for (const table of store.db.tables) {
    for (const row of (await table.toArray()) as Record<string, unknown>[]) {
      const { createdAt, updatedAt, patientId, assessmentId } = row;
      if (typeof updatedAt === 'string' && typeof createdAt === 'string') {
        if (updatedAt > latest || createdAt < EARLIEST_TIMESTAMP || createdAt > updatedAt) problems.push(`${table.name} ${String(row.id)} stamped ${createdAt} / ${updatedAt}`);
      }
      if (table.name !== 'patients' && typeof patientId === 'string' && !patients.has(patientId)) problems.push(`${table.name} ${String(row.id)}: no patient ${patientId}`);
      if (typeof assessmentId === 'string' && !assessments.has(assessmentId)) problems.push(`${table.name} ${String(row.id)}: no assessment ${assessmentId}`);
    }
  }
  return problems;
}

async function makeStore(name: string, startMs: number): Promise<KinnoteStore> {
  let t = startMs;
  const store = await openStore({ name, now: () => (t += 1000), kdfIterations: 1000, idleTimeoutMs: null, indexedDB: new IDBFactory(), IDBKeyRange });
  return store;
}

async function therapistStore(): Promise<KinnoteStore> {
  const store = await makeStore('fuzz-therapist', Date.UTC(2025, 2, 1, 9));
  await store.ensureActor({ deviceName: 'Fuzz tablet', platform: 'node', clinicianName: 'Fuzz Clinician', profession: 'physiotherapist' });
  await store.vault.setup('fuzz passphrase');
  return store;
}

const CODE = '7KQ2M-XD4PH';
const sealing = { randomBytes: (n: number) => new SeededRandom(n).bytes(n), iterations: 1000 };
const plan: ExercisePlan = {
  title: 'Fuzz programme',
  startsOn: '2025-03-01',
  endsOn: null,
  exercises: [{ name: 'Calf stretch', dose: { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 5, sets: 1, timesPerDay: 2 }, dosageText: '' }],
};

/** Runs every importer `cases` times from `seed`; returns the counts per importer. */
export async function fuzzImporters(cases: number, seed: number, options: FuzzOptions = {}): Promise<Record<string, FuzzCounts>> {
  const out: Record<string, FuzzCounts> = {};
  const runs = (name: ImporterName) => !options.only || options.only.includes(name);
  const importBackupUnderTest = options.importBackup ?? importBackup;
  const pendulumBase = readFileSync(join(fixtures, 'pendulum', 'healthy-100hz.csv'), 'utf8');
  if (runs('pendulum')) out.pendulum = await textFuzz(cases, seed, pendulumBase, (t) => void analysePendulumCsv(t, 'fuzz.csv'), (e) => e instanceof PendulumInputError, 'pendulum');
  const motionBase = readFileSync(join(fixtures, 'sensors', 'healthy-phone-60hz.csv'), 'utf8');
  if (runs('motion')) out.motion = await textFuzz(cases, seed + 1, motionBase, (t) => void analyseMotionRecording(parseMotionCsv(t, 'fuzz.csv'), { fileName: 'fuzz.csv' }), (e) => e instanceof MotionInputError, 'motion');
  const reliabilityBase = 'subject,rater_a_1,rater_a_2,rater_b_1\nS01,12.5,13,14\nS02,20,21.5,19\nS03,31,30,33.5\nS04,8,9.5,7\nS05,15,15,16\nS06,25.5,24,26\n';
  if (runs('reliability')) out.reliability = await textFuzz(
    cases,
    seed + 2,
    reliabilityBase,
    (t) => {
      const { table } = readReliabilityCsv(t, 'fuzz.csv');
      const complete = completeSubjects(table, 'refuse');
      if (complete.table.subjectIds.length < 2) throw new StatsInputError('fewer than 2 subjects');
      intraclassCorrelations(anovaMeanSquares(complete.table.scores, complete.table.subjectIds.length, table.trialCount), 0.95);
    },
    (e) => e instanceof StatsInputError || e instanceof MissingCellError,
    'reliability',
  );

  // Backup: edited bundles, re-signed so that the record checks are reached (and half of them as text edits).
  const source = await therapistStore();
  const patient = await source.patients.create({ code: 'K7QM-3XHD', birthYear: 1961, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = await source.assessments.create({ patientId: patient.id, assessorId: source.actor!.clinicianId, performedAt: '2025-03-01T10:00:00.000Z', setting: 'clinic', conditions: { position: 'supine', minutesSinceMedication: null, painNrs: 2 }, notes: 'Invented fuzz note' });
  await source.observations.create({ patientId: patient.id, assessmentId: assessment.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '1+'), traceId: null });
  await source.traces.create({ patientId: patient.id, assessmentId: assessment.id, kind: 'other', startedAt: '2025-03-01T10:00:00.000Z', sampleRateHz: 50, channels: [{ name: 'x', unit: 'deg', samples: Float64Array.from([1, 2, 3]) }] });
  const bundle = await exportBackup(source, { protectedContent: 'include' });
  const programmeRecord = await source.homeProgrammes.create(planToProgrammeInput(plan, patient.id));
  const target = await therapistStore();
  if (runs('backup')) {
    const rng = new SeededRandom(seed + 3);
    const counts = newCounts();
    for (let i = 0; i < cases; i++) {
      let input: unknown;
      if (rng.chance(0.3)) input = mutateText(JSON.stringify(bundle), rng);
      else {
        // Half the edits go into one non-empty table's records: from the root they rarely get past
        // the header (most tables are empty), so the record checks would seldom be reached.
        const tables = bundle.tables as unknown as Record<string, unknown[]>;
        const filled = Object.keys(tables).filter((name) => (tables[name]?.length ?? 0) > 0);
        const where = rng.int(0, 2);
        const inRecords = filled[rng.int(0, filled.length - 1)]!;
        const edited =
          where === 0 ? mutateJson(bundle, rng) : where === 1 ? { ...bundle, tables: { ...tables, [inRecords]: mutateJson(tables[inRecords], rng) } } : { ...bundle, tables: mutateRecords(tables, rng) };
        const { checksum: _c, ...body } = edited as Record<string, unknown>;
        input = { ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } };
      }
      counts.tried++;
      const before = await fingerprint(target);
      try {
        await importBackupUnderTest(target, input);
        counts.accepted++;
        const problems = await unsoundness(target, target.context.now());
        if (problems.length > 0) {
          counts.unsound++;
          if (counts.crashes.length < 5) counts.crashes.push(`backup case ${i} accepted, then: ${problems.slice(0, 2).join('; ')}`);
        }
      } catch (error) {
        record(counts, error, error instanceof StoreError, `backup case ${i}`);
        if ((await fingerprint(target)) !== before) counts.partialWrites++;
      }
    }
    out.backup = counts;
  }

  // Programme hand-off: the package's content edited and sealed again, opened and accepted on a phone.
  const pkgText = await createProgrammePackage({ patient, programme: programmeRecord, issuedAt: '2025-03-01T10:00:00.000Z' }, CODE, sealing);
  const { plan: _plan, ...pkgBody } = await openProgrammePackage(pkgText, CODE);
  const phone = await makeStore('fuzz-phone', Date.UTC(2025, 2, 3, 8));
  await choosePatientMode(phone);
  if (runs('programme')) {
    const rng = new SeededRandom(seed + 4);
    const counts = newCounts();
    for (let i = 0; i < cases; i++) {
      const text = rng.chance(0.2) ? mutateText(pkgText, rng) : await sealTransfer(JSON.stringify(mutateJson(pkgBody, rng)), CODE, sealing);
      counts.tried++;
      const before = await fingerprint(phone);
      try {
        const opened = await openProgrammePackage(text, CODE);
        await acceptProgrammePackage(phone, opened, { now: () => Date.UTC(2025, 2, 3, 8), platform: 'fuzz', today: '2025-03-03' });
        counts.accepted++;
      } catch (error) {
        record(counts, error, error instanceof ProgrammeTransferError || error instanceof StoreError, `programme case ${i}`);
        if ((await fingerprint(phone)) !== before) counts.partialWrites++;
      }
    }
    out.programme = counts;
  }

  if (runs('report')) {
    // Home report: a report made by hand, edited, sealed and imported on the therapist's tablet.
    Object.assign(target.context, { now: () => Date.UTC(2025, 2, 10, 9) });
    await importBackup(target, await exportBackup(source, { protectedContent: 'include' }));
    const deviceId = phone.actor?.deviceId ?? source.context.newId();
    const report = {
      format: 'kinnote-home-report',
      formatVersion: 1,
      exportedAt: '2025-03-09T18:00:00.000Z',
      patient: { id: patient.id, code: patient.code },
      device: { id: deviceId, createdAt: '2025-03-03T08:00:00.000Z', updatedAt: '2025-03-03T08:00:00.000Z', deviceId, clinicianId: programmeRecord.clinicianId, deleted: false, name: 'Home phone', platform: null },
      adherenceEntries: [{ id: source.context.newId(), createdAt: '2025-03-09T18:00:00.000Z', updatedAt: '2025-03-09T18:00:00.000Z', deviceId, clinicianId: programmeRecord.clinicianId, deleted: false, patientId: patient.id, programmeId: programmeRecord.id, periodStart: '2025-03-03', sessionsPlanned: 14, sessionsDone: 9, reportedBy: 'patient' }],
      selfReports: [{ id: source.context.newId(), createdAt: '2025-03-09T18:00:00.000Z', updatedAt: '2025-03-09T18:00:00.000Z', deviceId, clinicianId: programmeRecord.clinicianId, deleted: false, patientId: patient.id, reportedOn: '2025-03-09', spasmFrequencyPenn: 2, spasmSeverityNrs: 3, stiffnessNrs: 4, painNrs: 1 }],
      ticks: [],
    };
    const rng = new SeededRandom(seed + 5);
    const counts = newCounts();
    for (let i = 0; i < cases; i++) {
      const body = i === 0 ? report : mutateJson(report, rng);
      const text = rng.chance(0.1) ? mutateText(await sealTransfer(JSON.stringify(body), CODE, sealing), rng) : await sealTransfer(JSON.stringify(body), CODE, sealing);
      counts.tried++;
      const before = await fingerprint(target);
      try {
        await importHomeReport(target, text, CODE, { id: patient.id, code: patient.code });
        counts.accepted++;
      } catch (error) {
        record(counts, error, error instanceof ProgrammeTransferError || error instanceof StoreError, `report case ${i}`);
        if ((await fingerprint(target)) !== before) counts.partialWrites++;
      }
    }
    out.report = counts;
  }
  source.close();
  target.close();
  phone.close();
  return out;
}
