import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { runCli } from '../../../src/cli/main';
import { SeededRandom } from '../../../src/lib/demo/seeded-random';
import { encryptBundleText, serializeBundle } from '../../../src/lib/store';
import { demoBundle } from '../../../src/lib/store/demo-caseload';

const scratch = mkdtempSync(join(tmpdir(), 'kinnote-cohort-'));

async function run(args: string[], env: Record<string, string> = {}): Promise<{ status: number; stdout: string; stderr: string[] }> {
  let stdout = '';
  const stderr: string[] = [];
  const status = await runCli(['cohort', ...args], { stdout: (t) => (stdout += t), stderr: (t) => stderr.push(t), env, cwd: scratch });
  return { status, stdout, stderr };
}

const bundle = await demoBundle({ seed: 4 });
const plainText = serializeBundle(bundle);
const plainPath = join(scratch, 'demo.json');
writeFileSync(plainPath, plainText);
const rng = new SeededRandom(77);
const encryptedPath = join(scratch, 'demo-encrypted.json');
writeFileSync(encryptedPath, await encryptBundleText(plainText, 'correct horse battery', { randomBytes: (n) => rng.bytes(n), iterations: 1000 }));

const rows = (path: string) => Papa.parse<Record<string, string>>(readFileSync(path, 'utf8'), { header: true, skipEmptyLines: true }).data;

describe('kinnote cohort', () => {
  it('writes the four files from a backup, de-identified, and prints a JSON summary', async () => {
    const out = join(scratch, 'out-plain');
    const { status, stdout, stderr } = await run([plainPath, '--out', out, '--event', 'botulinum-toxin-injection', '--window-weeks', '4-17']);
    expect(stderr).toEqual([]);
    expect(status).toBe(0);
    const report = JSON.parse(stdout);
    expect(report.disclosure).toMatchObject({ kind: 'deidentified', keySaved: false });
    expect(report.files.map((f: { kind: string }) => f.kind)).toEqual(['long', 'wide', 'summary', 'fhir']);
    expect(report.count.pairs).toBeGreaterThan(0);
    const long = rows(join(out, 'kinnote-cohort-long.csv'));
    expect(long.length).toBe(report.count.observations);
    expect(long.every((r) => /^P-[0-9a-f]{16}$/.test(r.patient!))).toBe(true);
    const fhir = JSON.parse(readFileSync(join(out, 'kinnote-cohort-fhir.json'), 'utf8'));
    expect(fhir.type).toBe('collection');
    expect(fhir.entry.length).toBe(report.count.patients + report.count.observations);
    // No identity of the backup in any file.
    const all = ['long.csv', 'wide.csv', 'summary.csv', 'fhir.json'].map((f) => readFileSync(join(out, `kinnote-cohort-${f}`), 'utf8')).join('\n');
    for (const identity of bundle.tables.identities as { familyName: string; givenName: string }[]) {
      expect(all.includes(identity.familyName)).toBe(false);
    }
  });

  it('reads an encrypted backup with KINNOTE_PASSPHRASE and gives the same cohort', async () => {
    const a = await run([plainPath, '--out', join(scratch, 'a'), '--files', 'summary']);
    const b = await run([encryptedPath, '--out', join(scratch, 'b'), '--files', 'summary'], { KINNOTE_PASSPHRASE: 'correct horse battery' });
    expect(b.stderr).toEqual([]);
    expect(b.status).toBe(0);
    expect(JSON.parse(b.stdout).count).toEqual(JSON.parse(a.stdout).count);
    // Statistics do not depend on the key: the summary files are identical.
    expect(readFileSync(join(scratch, 'b', 'kinnote-cohort-summary.csv'), 'utf8')).toBe(readFileSync(join(scratch, 'a', 'kinnote-cohort-summary.csv'), 'utf8'));
    expect(existsSync(join(scratch, 'b', 'kinnote-cohort-long.csv'))).toBe(false);
  });

  const refusals: [string, string[], Record<string, string>, RegExp][] = [
    ['encrypted without a passphrase', [encryptedPath, '--out', 'x'], {}, /demo-encrypted\.json: .*passphrase.*KINNOTE_PASSPHRASE/],
    ['a wrong passphrase', [encryptedPath, '--out', 'x'], { KINNOTE_PASSPHRASE: 'wrong' }, /demo-encrypted\.json: wrong passphrase/],
    ['an unknown measure', [plainPath, '--out', 'x', '--measure', 'nope'], {}, /demo\.json: filters\.measureCode: "nope" is not a measure/],
    ['a bad date', [plainPath, '--out', 'x', '--from', '2025-13-01'], {}, /--from: 2025-13-01 does not exist in the calendar/],
    ['a window without an event', [plainPath, '--out', 'x', '--window-weeks', '6-12'], {}, /--event/],
    ['a missing file', ['missing.json', '--out', 'x'], {}, /missing\.json: cannot read the file \(ENOENT\)/],
    ['no --out', [plainPath], {}, /--out DIR is required/],
  ];
  for (const [what, args, env, message] of refusals) {
    it(`refuses ${what}: exit 1, one line on stderr, nothing on stdout`, async () => {
      const { status, stdout, stderr } = await run(args, env);
      expect(status).toBe(1);
      expect(stdout).toBe('');
      expect(stderr).toHaveLength(1);
      expect(stderr[0]).not.toContain('\n');
      expect(stderr[0]).toMatch(message);
    });
  }

  it('refuses an altered backup, naming the file and the reason', async () => {
    const parsed = JSON.parse(plainText);
    parsed.tables.observations[0].value = { kind: 'angle', angleDeg: 'ninety' };
    const path = join(scratch, 'altered.json');
    writeFileSync(path, JSON.stringify(parsed));
    const { status, stderr, stdout } = await run([path, '--out', 'x']);
    expect(status).toBe(1);
    expect(stdout).toBe('');
    expect(stderr[0]).toMatch(/altered\.json: .*checksum/);
  });

  it('refuses an invalid record (checksum recomputed), naming record and field', async () => {
    const { createBundle } = await import('../../../src/lib/store');
    const tables = structuredClone(bundle.tables) as unknown as Record<string, Record<string, unknown>[]>;
    (tables.observations![0] as Record<string, unknown>).side = 'middle';
    const { checksum: _c, tables: _t, ...header } = bundle;
    const bad = await createBundle(tables as never, header);
    const path = join(scratch, 'invalid.json');
    writeFileSync(path, serializeBundle(bad));
    const { status, stderr } = await run([path, '--out', 'x']);
    expect(status).toBe(1);
    expect(stderr[0]).toMatch(/invalid\.json: .*tables\.observations\[\d+\] \([0-9a-f-]+\) side/);
  });

  it('--identified names patients and warns on stderr', async () => {
    const out = join(scratch, 'identified');
    const { status, stderr } = await run([plainPath, '--out', out, '--identified', '--files', 'long']);
    expect(status).toBe(0);
    expect(stderr.join('\n')).toMatch(/warning: identified export/);
    const long = rows(join(out, 'kinnote-cohort-long.csv'));
    const families = new Set((bundle.tables.identities as { familyName: string }[]).map((i) => i.familyName));
    expect(long.some((r) => families.has(r.family_name!))).toBe(true);
  });
});
