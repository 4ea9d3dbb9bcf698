// The referral report's PDF, read back by a program outside the builder: poppler's pdftotext and
// pdfinfo (poppler-utils; .ci/run installs it). Every demo patient's report: A4, one or two pages, the
// verdict sentences, the summary and the cautions as extractable text, the name only when chosen.
// The standard fonts' WinAnsi limit is checked against Windows-1252 as glibc's iconv knows it.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pdfSafeText, SYMBOL_SPELLINGS } from '../../../src/lib/export/pdf-safe-text';
import { referralReportPdf } from '../../../src/lib/export/referral-report-pdf';
import { type ReferralReport } from '../../../src/lib/export';
import { REPORT_CAUTIONS } from '../../../src/lib/export/referral-report';
import { demoReports } from './demo-reports';

const POPPLER = ['/usr/bin/pdftotext', '/usr/bin/pdfinfo', '/usr/bin/iconv'];
let dir = '';
beforeAll(() => {
  const missing = POPPLER.filter((p) => !existsSync(p));
  if (missing.length > 0) throw new Error(`these tests read the PDF with poppler-utils: ${missing.join(', ')} missing (apt-get install -y poppler-utils)`);
  dir = mkdtempSync(join(tmpdir(), 'kinnote-report-pdf-'));
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

let fileCount = 0;
/** Writes the bytes to a file and reads them back with poppler: text (whitespace collapsed) and pdfinfo fields. */
function readBack(bytes: Uint8Array): { text: string; firstColumn: string; info: Record<string, string> } {
  const file = join(dir, `r${++fileCount}.pdf`);
  writeFileSync(file, bytes);
  const text = execFileSync('/usr/bin/pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  // The measures' titles wrap inside their column, beside the other columns' values: read that column alone
  // (a crop 175 pt wide at 72 dpi, i.e. the 13 mm margin and the 140 pt column).
  const firstColumn = execFileSync('/usr/bin/pdftotext', ['-enc', 'UTF-8', '-r', '72', '-x', '0', '-y', '0', '-W', '175', '-H', '842', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  const info = Object.fromEntries(
    execFileSync('/usr/bin/pdfinfo', [file], { encoding: 'utf8' })
      .split('\n')
      .filter((line) => line.includes(':'))
      .map((line) => [line.slice(0, line.indexOf(':')).trim(), line.slice(line.indexOf(':') + 1).trim()]),
  );
  return { text, firstColumn, info };
}

/** How the PDF must spell a model sentence: whitespace collapsed, the minus sign as a hyphen-minus (the deliberate spelling). */
const spelled = (s: string) => s.replace(/\u2212/g, '-').replace(/\s+/g, ' ');
const createdAtMs = Date.UTC(2026, 11, 1, 9, 30);

describe('referralReportPdf on the demo caseload (seed 20261201)', () => {
  const pseudonymous = demoReports(false);
  const named = demoReports(true);

  it('every report is A4 with one or two pages, and says each verdict, the summary and the cautions as text', async () => {
    expect(pseudonymous.length).toBeGreaterThan(5);
    const pages: number[] = [];
    for (const { report } of pseudonymous) {
      const pdf = await referralReportPdf(report, { locale: 'en-GB', createdAtMs });
      const { text, firstColumn, info } = readBack(pdf.bytes);
      // pdfinfo: "Page size: 595.28 x 841.89 pts (A4)"; 210 × 297 mm = 595.28 × 841.89 pt (ISO 216).
      const size = /^([\d.]+) x ([\d.]+) pts \(A4\)$/.exec(info['Page size'] ?? '');
      expect(size, info['Page size']).not.toBeNull();
      expect(Math.abs(Number(size![1]) - 595.28)).toBeLessThan(0.01);
      expect(Math.abs(Number(size![2]) - 841.89)).toBeLessThan(0.01);
      expect(Number(info['Pages'])).toBe(pdf.pageCount);
      pages.push(pdf.pageCount);
      expect(text).toContain(report.patientCode);
      expect(text).toContain(spelled(report.summaryText));
      expect(report.measures.length).toBeGreaterThan(0);
      for (const m of report.measures) {
        expect(text, `${report.patientCode}: ${m.title}`).toContain(spelled(m.sentence));
        expect(firstColumn).toContain(spelled(m.title));
      }
      for (const caution of REPORT_CAUTIONS) expect(text).toContain(spelled(caution));
      expect(text).toMatch(/not a diagnostic device.*decisions rest with licensed clinicians.*local protocols and data-protection law/);
      // No character outside WinAnsi reached the file as a wrong glyph: the minus sign is spelled "-".
      expect(text).not.toContain('\u2212');
      expect(pdf.fileName).toBe(`kinnote-report-${report.patientCode}-${report.throughDay}.pdf`);
    }
    console.log(`demo report PDFs: pages ${pages.join(', ')}`);
    expect(Math.min(...pages)).toBeGreaterThanOrEqual(1);
    expect(Math.max(...pages)).toBeLessThanOrEqual(2);
  }, 60_000);

  it('holds the name (in the text, never in the metadata or file name) only when the report carries it', async () => {
    for (let i = 0; i < 3; i++) {
      const { report, name } = pseudonymous[i]!;
      const family = name.split(' ').pop()!;
      const plain = readBack((await referralReportPdf(report, { locale: 'en-GB', createdAtMs })).bytes);
      expect(plain.text).not.toContain(family);
      const withName = await referralReportPdf(named[i]!.report, { locale: 'en-GB', createdAtMs });
      const read = readBack(withName.bytes);
      expect(read.text).toContain(name);
      expect(JSON.stringify(read.info)).not.toContain(family);
      expect(read.info['Title']).toContain(report.patientCode);
      expect(withName.fileName).not.toContain(family);
    }
  }, 60_000);

  it('writes the report symbols WinAnsi has (° ± · –) as themselves, spells the others deliberately, and simplifies foreign letters of a name', async () => {
    const base = named[0]!.report;
    const report: ReferralReport = {
      ...base,
      identity: { name: 'Łucja Żółkiewska-Nuñez', dateOfBirth: null },
      notes: [...base.notes, 'Test note: MDC ≥ 5°, ≤ 10°, ±0.5°, −3 · 1–2 → done; 中'],
    };
    const pdf = await referralReportPdf(report, { locale: 'en-GB', createdAtMs });
    const { text } = readBack(pdf.bytes);
    expect(text).toContain('Test note: MDC >= 5°, <= 10°, ±0.5°, -3 · 1–2 -> done; ?');
    // ó and ñ are in Windows-1252; Ł, Ż, ł are not (no accents left, as a person would write them in plain Latin letters).
    expect(text).toContain('Lucja Zólkiewska-Nuñez');
    expect([...pdf.simplified].sort()).toEqual(['Ł→L', 'Ż→Z', 'ł→l', '中→?'].sort());
  }, 30_000);
});

describe('pdfSafeText against Windows-1252 (the code page of PDF WinAnsiEncoding, ISO 32000-1 Annex D)', () => {
  // The oracle: glibc's iconv decoding every byte 0x20..0xFF (but DEL) from CP1252, one per line; `-c` drops
  // the five bytes the code page leaves undefined, so their lines come back empty. (Node's TextDecoder
  // is no oracle here: this Node decodes windows-1252 as Latin-1, 0x80..0x9F as C1 controls.)
  const winAnsi = new Set<number>();
  const bytes: number[] = [];
  for (let b = 0x20; b <= 0xff; b++) if (b !== 0x7f) bytes.push(b, 0x0a);
  const decoded = existsSync('/usr/bin/iconv') ? execFileSync('/usr/bin/iconv', ['-c', '-f', 'CP1252', '-t', 'UTF-8'], { input: Buffer.from(bytes), encoding: 'utf8' }).split('\n') : [];
  for (const line of decoded) if (line !== '') winAnsi.add(line.codePointAt(0)!);
  it('the oracle holds the 218 characters of Windows-1252 from space on (256 - 32 controls - DEL - 5 undefined)', () => {
    expect(winAnsi.size).toBe(218);
  });
  const cases: { input: string; expected: string; simplified: string[] }[] = [
    { input: 'plain text 123', expected: 'plain text 123', simplified: [] },
    { input: '110° ± 5° · 1–2 … “quoted” €', expected: '110° ± 5° · 1–2 … “quoted” €', simplified: [] },
    { input: '−2 grade steps', expected: '-2 grade steps', simplified: [] },
    { input: 'R2 ≥ 1.6, ≤ 2', expected: 'R2 >= 1.6, <= 2', simplified: [] },
    { input: '12\u202F:00', expected: '12 :00', simplified: [] },
    { input: 'Dvořák Łódź', expected: 'Dvorák Lódz', simplified: ['ř→r', 'Ł→L', 'ź→z'] },
    { input: 'Ωμέγα', expected: '?????', simplified: ['Ω→?', 'μ→?', 'έ→?', 'γ→?', 'α→?'] },
  ];
  it.each(cases)('$input', ({ input, expected, simplified }) => {
    const result = pdfSafeText(input, winAnsi);
    expect(result.text).toBe(expected);
    expect(result.simplified).toEqual(simplified);
    for (const ch of result.text) expect(winAnsi.has(ch.codePointAt(0)!), ch).toBe(true);
  });
  it("pdf-lib's Helvetica writes exactly these characters (the set the builder passes to pdfSafeText)", async () => {
    const doc = await PDFDocument.create();
    const font = await doc.embedFont(StandardFonts.Helvetica);
    expect([...font.getCharacterSet()].sort((a, b) => a - b)).toEqual([...winAnsi].sort((a, b) => a - b));
  });
  it('every deliberate spelling is itself in Windows-1252', () => {
    for (const spelling of Object.values(SYMBOL_SPELLINGS)) for (const ch of spelling) expect(winAnsi.has(ch.codePointAt(0)!), ch).toBe(true);
  });
});
