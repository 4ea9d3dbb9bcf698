// Bulk insert rate of the record store in Node on fake-indexeddb: 100,000 observations through the
// repository's bulk path (validated, stamped, one batch audit entry per batch, one transaction per batch).
// Figures are printed, never asserted. The Chromium figure (real IndexedDB) comes from the browser bench.
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { ordinalValue, type RecordInput, type Observation } from '../../src/lib/domain';
import { importBackup, openStore, readBackup, serializeBundle, type KinnoteStore } from '../../src/lib/store';
import { tableRows } from '../../src/lib/store/table-rows';
import { exportBackup } from '../../src/lib/store/export-backup';
import { IMPORT_BENCH_BASE, mainSourceTree } from './main-path';

// STORE_BENCH_OBSERVATIONS: a smaller size on a loaded machine (the size is printed with each figure).
const TOTAL = Number(process.env.STORE_BENCH_OBSERVATIONS ?? 100_000);
const BATCH = 5_000;

export async function run(print: (line: string) => void): Promise<void> {
  const store = await openStore({ name: 'bench', indexedDB: new IDBFactory(), IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
  await store.ensureActor({ deviceName: 'bench', platform: 'node', clinicianName: 'Bench', profession: 'physiotherapist' });
  const patient = await store.patients.create({ code: 'BNCH-2345', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = await store.assessments.create({
    patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt: '2025-03-01T10:00:00.000Z', setting: 'clinic',
    conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null,
  });
  const grades = ['0', '1', '1+', '2', '3', '4'];
  const input = (i: number): RecordInput<Observation> => ({
    patientId: patient.id, assessmentId: assessment.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'elbow-flexors',
    side: i % 2 ? 'left' : 'right', mode: null, instrument: null, value: ordinalValue('mas', grades[i % 6]!), traceId: null,
  });
  const start = performance.now();
  for (let done = 0; done < TOTAL; done += BATCH) {
    await store.observations.createMany(Array.from({ length: BATCH }, (_, k) => input(done + k)));
  }
  const insertMs = performance.now() - start;
  const count = (await store.observations.list({ includeDeleted: true })).length;
  print(`bulk insert, fake-indexeddb (Node ${process.version}): ${count} observations in ${(insertMs / 1000).toFixed(2)} s = ${Math.round((TOTAL / insertMs) * 1000)} observations/s (batches of ${BATCH}, validated, stamped, ${await store.audit.count()} audit entries)`);

  const seriesStart = performance.now();
  const series = await store.observations.series(patient.id, 'mas');
  print(`series read of ${series.length} observations (one patient's blocks, filtered and ordered): ${((performance.now() - seriesStart) / 1000).toFixed(2)} s`);

  const exportStart = performance.now();
  const bundle = await exportBackup(store, { protectedContent: 'omit' });
  print(`export of ${bundle.tables.observations.length} observations + ${bundle.tables.audit.length} audit entries with checksum: ${((performance.now() - exportStart) / 1000).toFixed(2)} s`);
  store.close();

  // As a file holds it: the text serializeBundle writes (the import hashes that text as written).
  const text = serializeBundle(bundle);
  const verifyStart = performance.now();
  await readBackup(text);
  const verifySeconds = (performance.now() - verifyStart) / 1000;
  print(`read and verify only (parse, checksum, every record, references; what \`kinnote cohort BACKUP\` does, no store): ${verifySeconds.toFixed(2)} s for ${(text.length / 1e6).toFixed(1)} MB`);

  // The same file into an empty store, by main's import path (commit IMPORT_BENCH_BASE, extracted
  // from git) and by the present one, in this run: the ratio holds although the load moves figures.
  const importInto = async (name: string, run: (store: KinnoteStore) => Promise<unknown>, open: typeof openStore = openStore) => {
    const target = await open({ name, indexedDB: new IDBFactory(), IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    await target.ensureActor({ deviceName: 'bench-2', platform: 'node', clinicianName: 'Bench 2', profession: 'physiotherapist' });
    const t0 = performance.now();
    const cpu0 = process.cpuUsage();
    await run(target);
    const seconds = (performance.now() - t0) / 1000;
    const cpu = process.cpuUsage(cpu0);
    const stored = await tableRows(target.db, 'observations').count();
    target.close();
    // CPU seconds of this process (user + system, all its threads): on a shared, loaded machine
    // they move far less than the wall time, which waits for the cores.
    return { seconds, cpuSeconds: (cpu.user + cpu.system) / 1e6, stored };
  };
  const main = mainSourceTree();
  let mainSeconds = Number.NaN;
  let mainCpu = Number.NaN;
  if (main) {
    const previous = (await import(join(main.dir, 'src/lib/store/index.ts'))) as typeof import('../../src/lib/store');
    const r = await importInto('bench-import-main', (t) => previous.importBackup(t as never, text), previous.openStore as unknown as typeof openStore);
    mainSeconds = r.seconds;
    mainCpu = r.cpuSeconds;
    print(`import by main's path (${main.commit}), same file, empty store on fake-indexeddb: ${r.stored.toLocaleString('en')} observations in ${r.seconds.toFixed(2)} s (${r.cpuSeconds.toFixed(2)} CPU s)`);
  } else print(`main's path (${IMPORT_BENCH_BASE}) not run: no git history here`);
  const r = await importInto('bench-import', (t) => importBackup(t, text));
  const scaled = (r.seconds * 100_000) / TOTAL;
  print(
    `import of that file (${r.stored.toLocaleString('en')} observations) into an empty store on fake-indexeddb (verify all, then one transaction): ${r.seconds.toFixed(2)} s (${r.cpuSeconds.toFixed(2)} CPU s)` +
      ` = ${scaled.toFixed(1)} s per 100,000 · goal < 10 s per 100,000: ${(10 / scaled).toFixed(2)}× of goal · ${(mainSeconds / r.seconds).toFixed(2)}× main's path in this run (CPU time: ${(mainCpu / r.cpuSeconds).toFixed(2)}×)`,
  );
  print(`  (load average ${loadavg().map((l) => l.toFixed(1)).join(', ')} at the end; fake-indexeddb is an in-memory IndexedDB written in JavaScript, used by the tests: this figure is verification + that emulation, not a device; the CLI imports into no store)`);
}
