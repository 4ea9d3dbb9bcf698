import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../../src/cli/main';
import { parseCsvRecords as parseCsv } from '../../../src/lib/stats/reliability-csv';
import { relativeError } from '../../support/relative-error';

const fixtureDir = join(process.cwd(), 'test/fixtures/stats');
const scratchDir = mkdtempSync(join(tmpdir(), 'kinnote-reliability-'));

async function run(args: string[]): Promise<{ status: number; stdout: string; stderr: string[] }> {
  let stdout = '';
  const stderr: string[] = [];
  const status = await runCli(['reliability', ...args], {
    stdout: (text) => (stdout += text),
    stderr: (text) => stderr.push(text),
    env: {},
    cwd: process.cwd(),
  });
  return { status, stdout, stderr };
}

function writeCsv(name: string, text: string): string {
  const path = join(scratchDir, name);
  writeFileSync(path, text);
  return path;
}

describe('kinnote reliability', () => {
  it('Shrout & Fleiss (1979) Table 2 as a CSV with BOM, CRLF and quoted fields', async () => {
    // Values: REFERENCES.md §1b–1d (ICC RECOMPUTED; 2-dp Table 4 values VERIFIED).
    const { status, stdout, stderr } = await run([join(fixtureDir, 'shrout-fleiss-table2.csv')]);
    expect(stderr).toEqual([]);
    expect(status).toBe(0);
    const result = JSON.parse(stdout);
    expect(Object.keys(result)).toEqual(['n', 'k', 'msRows', 'msColumns', 'msError', 'msWithin', 'icc', 'sem', 'mdc95', 'mdc90', 'warnings']);
    expect(result.n).toBe(6);
    expect(result.k).toBe(4);
    expect(relativeError(result.msRows, 11.2417)).toBeLessThan(5e-6);
    expect(relativeError(result.msError, 1.0194)).toBeLessThan(5e-5);
    expect(Object.keys(result.icc)).toEqual(['1,1', '2,1', '3,1', '1,k', '2,k', '3,k']);
    expect(result.icc['2,1'].value).toBeCloseTo(0.289764, 6);
    expect(result.icc['2,1'].ci95[0]).toBeCloseTo(0.018787, 6);
    expect(result.icc['3,k'].ci95[1]).toBeCloseTo(0.985892, 6);
    expect(result.icc['1,k'].ci95[0]).toBeCloseTo(-0.884442, 6);
    // sem = √msError (Weir 2005); MDC95 = 1.96·√2·SEM, MDC90 = 1.645·√2·SEM.
    expect(relativeError(result.sem, Math.sqrt(15.2917 / 15))).toBeLessThan(5e-5);
    expect(relativeError(result.mdc95, 1.96 * Math.SQRT2 * result.sem)).toBeLessThan(1e-15);
    expect(relativeError(result.mdc90, 1.645 * Math.SQRT2 * result.sem)).toBeLessThan(1e-15);
    expect(result.warnings).toEqual([]);
  });

  it('refuses a missing cell: exit 1, one stderr line naming file, line and reason, nothing on stdout', async () => {
    const path = writeCsv('missing.csv', 'subject,day 1,day 2\nS1,1,2\nS2,,3\nS3,4,5\n');
    const { status, stdout, stderr } = await run([path]);
    expect(status).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toHaveLength(1);
    expect(stderr[0]).toContain(path);
    expect(stderr[0]).toMatch(/line 3: subject "S2" has no score for "day 1"/);
  });

  it('--drop-incomplete drops the subject with a warning on stderr and in "warnings"', async () => {
    const path = writeCsv('drop.csv', 'subject,day 1,day 2\nS1,1,2\nS2,,3\nS3,4,5\nS4,2,2.5\n');
    const { status, stdout, stderr } = await run([path, '--drop-incomplete']);
    expect(status).toBe(0);
    const result = JSON.parse(stdout);
    expect(result.n).toBe(3);
    expect(result.warnings).toHaveLength(1);
    expect(result.warnings[0]).toMatch(/line 3: dropped subject "S2"/);
    expect(stderr.join('\n')).toMatch(/warning: .*dropped subject "S2"/);
  });

  const refusals: [string, string, RegExp][] = [
    ['not-a-number.csv', 'subject,a,b\nS1,1,2\nS2,3,x7\n', /line 3: subject "S2", column "b": "x7" is not a finite decimal number \(non-numeric value\)/],
    ['decimal-comma.csv', 'subject,a,b\nS1,1,2\nS2,"3,5",4\n', /line 3: .*"3,5" is not a finite decimal number/],
    ['short-row.csv', 'subject,a,b\nS1,1,2\nS2,3\n', /line 3: 2 fields, the header has 3/],
    ['one-trial.csv', 'subject,a\nS1,1\nS2,3\n', /line 1: .*at least 2 trial or rater columns/],
    ['open-quote.csv', 'subject,a,b\n"S1,1,2\n', /line 2: a quoted field is never closed/],
    ['empty.csv', '', /the file is empty/],
    ['one-subject.csv', 'subject,a,b\nS1,1,2\n', /1 complete subject\(s\); the ICC needs at least 2/],
  ];
  for (const [name, text, reason] of refusals) {
    it(`refuses ${name}`, async () => {
      const path = writeCsv(name, text);
      const { status, stdout, stderr } = await run([path]);
      expect(status).toBe(1);
      expect(stdout).toBe('');
      expect(stderr).toHaveLength(1);
      expect(stderr[0]).toContain(name);
      expect(stderr[0]).toMatch(reason);
    });
  }

  it('refuses a file that does not exist, and a missing argument', async () => {
    const missing = await run([join(scratchDir, 'nope.csv')]);
    expect(missing.status).toBe(1);
    expect(missing.stderr[0]).toMatch(/nope\.csv: cannot read the file \(ENOENT\)/);
    const none = await run([]);
    expect(none.status).toBe(1);
    expect(none.stdout).toBe('');
  });

  it('a table with no variation gives null ICCs rather than numbers', async () => {
    const path = writeCsv('flat.csv', 'subject,a,b\nS1,5,5\nS2,5,5\nS3,5,5\n');
    const { status, stdout } = await run([path]);
    expect(status).toBe(0);
    const result = JSON.parse(stdout);
    expect(result.icc['1,1'].value).toBeNull();
    expect(result.sem).toBe(0);
  });
});

describe('parseCsv (RFC 4180)', () => {
  it('quotes, doubled quotes, embedded commas and line breaks, CRLF, BOM, trailing blank lines', () => {
    const records = parseCsv('\ufeffa,"b ""q""",c\r\n1,"x, y","line\r\nbreak"\r\n\r\n', 't.csv');
    expect(records).toEqual([
      { line: 1, fields: ['a', 'b "q"', 'c'] },
      { line: 2, fields: ['1', 'x, y', 'line\r\nbreak'] },
    ]);
  });
  it('last record without a line end, empty fields kept', () => {
    expect(parseCsv('a,,c\n,,', 't.csv')).toEqual([
      { line: 1, fields: ['a', '', 'c'] },
      { line: 2, fields: ['', '', ''] },
    ]);
  });
  it('refuses text after a closing quote', () => {
    expect(() => parseCsv('"a"b,c\n', 't.csv')).toThrow(/line 1: text after a closing quote/);
  });
});
