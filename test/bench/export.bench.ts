// `npm run bench -- export`: long CSV of 1,000,000 observations, Kinnote's streamed writer side by
// side with papaparse's unparse on the same rows. Each runs in its own child process (same invented
// records, same cohort), so peak memory (max RSS and sampled heap) belongs to one method alone.
// Figures are printed, never asserted.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import Papa from 'papaparse';
import type { Assessment, Clinician, Observation, Patient } from '../../src/lib/domain';
import { buildCohortIndex, countCohort, selectCohort, type CohortRecords } from '../../src/lib/export';
import { longCsvChunks, longCsvHeader } from '../../src/lib/export/long-csv';
import { prepareDisclosure, type DisclosurePlan } from '../../src/lib/export/prepare-disclosure';

const OBSERVATIONS = 1_000_000;
const PATIENTS = 5_000;
const PER_ASSESSMENT = 4;
const ASSESSMENTS_PER_PATIENT = OBSERVATIONS / PATIENTS / PER_ASSESSMENT;
const MAS = ['0', '1', '1+', '2', '3', '4'];

/** Invented records: 5,000 patients × 50 assessments × 4 observations (MAS both sides, ROM, a rating). */
function records(): CohortRecords {
  const stamp = { createdAt: '2025-01-01T00:00:00.000Z', updatedAt: '2025-01-01T00:00:00.000Z', deviceId: 'd', clinicianId: 'c1', deleted: false };
  const id = (prefix: string, n: number) => `${prefix}${n.toString(16).padStart(12, '0')}`;
  const clinicians: Clinician[] = [{ ...stamp, id: 'c1', displayName: 'Bench Clinician', profession: 'physiotherapist', registration: null }];
  const patients: Patient[] = [];
  const assessments: Assessment[] = [];
  const observations: Observation[] = [];
  let seed = 12345;
  const next = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32);
  for (let p = 0; p < PATIENTS; p++) {
    const patientId = id('p', p);
    patients.push({ ...stamp, id: patientId, code: 'BNCH-2345', birthYear: 1940 + (p % 60), condition: 'stroke', affectedSides: ['left'], status: 'active' });
    for (let a = 0; a < ASSESSMENTS_PER_PATIENT; a++) {
      const assessmentId = id('a', p * ASSESSMENTS_PER_PATIENT + a);
      const takenAt = new Date(Date.UTC(2023, 0, 1) + (a * 7 + (p % 5)) * 86_400_000 + 36_000_000).toISOString();
      assessments.push({ ...stamp, id: assessmentId, patientId, assessorId: 'c1', performedAt: takenAt, setting: a % 3 === 0 ? 'home' : 'clinic', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null });
      const base = { ...stamp, patientId, assessmentId, takenAt, mode: null, instrument: null, traceId: null };
      const grade = (k: number) => MAS[k % 6] as string;
      const n = observations.length;
      observations.push(
        { ...base, id: id('o', n), measureCode: 'mas', siteCode: 'ankle-plantarflexors', side: 'left', value: { kind: 'ordinal', grade: grade(p + a), rank: (p + a) % 6 } },
        { ...base, id: id('o', n + 1), measureCode: 'mas', siteCode: 'ankle-plantarflexors', side: 'right', value: { kind: 'ordinal', grade: grade(p + 2 * a), rank: (p + 2 * a) % 6 } },
        { ...base, id: id('o', n + 2), measureCode: 'rom', siteCode: 'knee-flexion', side: 'left', mode: 'passive', instrument: 'universal-goniometer', value: { kind: 'angle', angleDeg: Math.round((90 + 40 * next()) * 10) / 10 } },
        { ...base, id: id('o', n + 3), measureCode: 'spasm-severity', siteCode: 'whole-body', side: 'none', value: { kind: 'rating', value: Math.floor(11 * next()) } },
      );
    }
  }
  return { patients, events: [], assessments, observations, clinicians };
}

/** The long file's rows as arrays of cells, built the same way for papaparse (mirrors long-csv.ts). */
function rowsForPapaparse(cohort: ReturnType<typeof selectCohort>, plan: DisclosurePlan): (string | number | null)[][] {
  const rows: (string | number | null)[][] = [];
  for (const pair of cohort.pairs) {
    const s = pair.series;
    const view = plan.patients.get(s.patient.id)!;
    for (let i = pair.baselineIndex; i <= pair.lastIndex; i++) {
      const o = s.observations[i]!;
      const a = s.assessments[i]!;
      const v = o.value;
      rows.push([
        view.label, view.birthYears, view.condition, s.days[i]! - view.zeroDay, null, null,
        i === pair.baselineIndex ? 'baseline' : i === pair.followUpIndex ? 'follow-up' : null,
        a.setting, plan.clinicianLabel(a.assessorId), o.measureCode, o.siteCode, o.side, o.mode, o.instrument, s.measure.unit,
        v.kind === 'angle' ? v.angleDeg : v.kind === 'rating' || v.kind === 'count' || v.kind === 'index' ? v.value : null,
        v.kind === 'ordinal' ? v.grade : null, v.kind === 'ordinal' ? v.rank : null, null, null, null, null,
      ]);
    }
  }
  return rows;
}

const MB = 1024 * 1024;

async function child(method: 'kinnote' | 'papaparse'): Promise<void> {
  let t = performance.now();
  const data = records();
  const buildRecordsMs = performance.now() - t;
  t = performance.now();
  const index = buildCohortIndex(data);
  const indexMs = performance.now() - t;
  t = performance.now();
  const count = countCohort(index, {});
  const countMs = performance.now() - t;
  t = performance.now();
  const countFilteredMs = (() => {
    const s = performance.now();
    countCohort(index, { settings: ['clinic'], measureCode: 'mas', side: 'left' });
    return performance.now() - s;
  })();
  const cohort = selectCohort(index, {});
  const plan = await prepareDisclosure(cohort, index, { kind: 'deidentified', keyBytes: new Uint8Array(32).fill(9), dates: { kind: 'days-from-baseline' } });
  const prepareMs = performance.now() - t;
  (globalThis as { gc?: () => void }).gc?.();
  const heapBefore = process.memoryUsage().heapUsed;
  let heapPeak = heapBefore;
  const hash = createHash('sha256');
  let bytes = 0;
  let rows = 0;
  let exportMs: number;
  let buildRowsMs = 0;
  if (method === 'kinnote') {
    t = performance.now();
    for (const chunk of longCsvChunks(cohort, plan)) {
      // Stand-in for a file or Blob write: the text is hashed and dropped.
      hash.update(chunk.text);
      bytes += chunk.text.length;
      rows += chunk.rows;
      const heap = process.memoryUsage().heapUsed;
      if (heap > heapPeak) heapPeak = heap;
    }
    exportMs = performance.now() - t;
  } else {
    t = performance.now();
    const table = rowsForPapaparse(cohort, plan);
    buildRowsMs = performance.now() - t;
    heapPeak = Math.max(heapPeak, process.memoryUsage().heapUsed);
    const u = performance.now();
    const text = Papa.unparse({ fields: longCsvHeader(plan), data: table }, { newline: '\r\n', escapeFormulae: true }) + '\r\n';
    exportMs = performance.now() - u;
    heapPeak = Math.max(heapPeak, process.memoryUsage().heapUsed);
    hash.update(text);
    bytes = text.length;
    rows = table.length;
  }
  process.stdout.write(
    `${JSON.stringify({
      method,
      rows,
      bytes,
      buildRecordsMs,
      indexMs,
      countMs,
      countFilteredMs,
      countObservations: count.observations,
      prepareMs,
      buildRowsMs,
      exportMs,
      heapBeforeMb: heapBefore / MB,
      heapPeakMb: heapPeak / MB,
      maxRssMb: process.resourceUsage().maxRSS / 1024,
      sha256: hash.digest('hex'),
    })}\n`,
  );
}

interface ChildReport {
  method: string;
  rows: number;
  bytes: number;
  buildRecordsMs: number;
  indexMs: number;
  countMs: number;
  countFilteredMs: number;
  countObservations: number;
  prepareMs: number;
  buildRowsMs: number;
  exportMs: number;
  heapBeforeMb: number;
  heapPeakMb: number;
  maxRssMb: number;
  sha256: string;
}

function runChild(method: string): ChildReport {
  const self = fileURLToPath(import.meta.url);
  const result = spawnSync(process.execPath, ['--max-old-space-size=6144', '--expose-gc', '--import', 'tsx', self, `--child=${method}`], { encoding: 'utf8', maxBuffer: 16 * MB });
  if (result.status !== 0) throw new Error(`${method} child failed: ${result.stderr}`);
  return JSON.parse(result.stdout.trim().split('\n').pop() as string) as ChildReport;
}

export async function run(print: (line: string) => void): Promise<void> {
  const k = runChild('kinnote');
  const p = runChild('papaparse');
  const rate = (r: ChildReport, ms: number) => r.rows / (ms / 1000);
  print(`${OBSERVATIONS.toLocaleString('en')} observations (${PATIENTS} patients), records built in ${(k.buildRecordsMs / 1000).toFixed(1)} s`);
  print(`cohort index ${k.indexMs.toFixed(0)} ms; live count (no filter) ${k.countMs.toFixed(1)} ms, (setting+measure+side) ${k.countFilteredMs.toFixed(1)} ms; select + disclosure ${k.prepareMs.toFixed(0)} ms`);
  print('');
  print('| long CSV, 1,000,000 rows | time | rows/s | MB/s (UTF-16 chars) | heap before | heap peak | max RSS |');
  print('|---|---|---|---|---|---|---|');
  print(`| Kinnote longCsvChunks (streamed, 64 KiB chunks) | ${(k.exportMs / 1000).toFixed(2)} s | ${Math.round(rate(k, k.exportMs)).toLocaleString('en')} | ${(k.bytes / MB / (k.exportMs / 1000)).toFixed(1)} | ${k.heapBeforeMb.toFixed(0)} MB | ${k.heapPeakMb.toFixed(0)} MB (+${(k.heapPeakMb - k.heapBeforeMb).toFixed(0)}) | ${k.maxRssMb.toFixed(0)} MB |`);
  print(`| papaparse unparse (rows prebuilt in ${(p.buildRowsMs / 1000).toFixed(2)} s) | ${(p.exportMs / 1000).toFixed(2)} s | ${Math.round(rate(p, p.exportMs)).toLocaleString('en')} | ${(p.bytes / MB / (p.exportMs / 1000)).toFixed(1)} | ${p.heapBeforeMb.toFixed(0)} MB | ${p.heapPeakMb.toFixed(0)} MB (+${(p.heapPeakMb - p.heapBeforeMb).toFixed(0)}) | ${p.maxRssMb.toFixed(0)} MB |`);
  print('');
  print(`ratio Kinnote / papaparse rows per second: ${(rate(k, k.exportMs) / rate(p, p.exportMs)).toFixed(2)} (unparse only), ${(rate(k, k.exportMs) / rate(p, p.exportMs + p.buildRowsMs)).toFixed(2)} (papaparse including building its rows)`);
  print(`same rows: ${k.rows === p.rows ? 'yes' : 'NO'} (${k.rows} vs ${p.rows}); byte-identical output: ${k.sha256 === p.sha256 ? 'yes' : 'no (quoting or number formatting differs)'}`);
}

const childArg = process.argv.find((a) => a.startsWith('--child='));
if (childArg) await child(childArg.slice('--child='.length) as 'kinnote' | 'papaparse');
