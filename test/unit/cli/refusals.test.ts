import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/main';
import { serializeBundle } from '../../../src/lib/store';
import { demoBundle } from '../../../src/lib/store/demo-caseload';

const scratch = mkdtempSync(join(tmpdir(), 'kinnote-refusals-'));
const fixtures = join(process.cwd(), 'test', 'fixtures');

async function run(args: string[]): Promise<{ status: number; stdout: string; stderr: string[] }> {
  let stdout = '';
  const stderr: string[] = [];
  const status = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => stderr.push(t), env: {}, cwd: scratch });
  return { status, stdout, stderr };
}

/** The rule for every refusal: status 1, nothing on stdout, exactly one line on stderr matching `reason`. */
async function expectRefusal(args: string[], reason: RegExp): Promise<string> {
  const { status, stdout, stderr } = await run(args);
  expect({ status, stdout }).toEqual({ status: 1, stdout: '' });
  expect(stderr).toHaveLength(1);
  expect(stderr[0]).not.toContain('\n');
  expect(stderr[0]).toMatch(reason);
  return stderr[0]!;
}

const write = (name: string, text: string) => {
  writeFileSync(join(scratch, name), text);
  return name;
};

const backup = write('demo.json', serializeBundle(await demoBundle({ seed: 2 })));

describe('every command refuses bad input with status 1 and one line', () => {
  it('numbers that overflow, hexadecimal and impossible dates, the same way in every reader', async () => {
    const table = write('overflow.csv', 'subject,t1,t2\nA,1,2\nB,1e400,3\nC,2,2\n');
    await expectRefusal(['reliability', table], /overflow\.csv: line 3: subject "B", column "t1": "1e400" is not a finite decimal number \(non-finite value\)/);
    const hexTable = write('hex.csv', 'subject,t1,t2\nA,1,2\nB,0x10,3\nC,2,2\n');
    await expectRefusal(['reliability', hexTable], /line 3.*"0x10" is not a finite decimal number \(non-numeric value\)/);
    // The same hexadecimal cell in a motion file and in a pendulum file: both refused as non-numeric.
    const motion = readFileSync(join(fixtures, 'sensors', 'healthy-phone-60hz.csv'), 'utf8').split('\r\n');
    motion[3] = motion[3]!.replace(/,[^,]*$/, ',0x10');
    await expectRefusal(['motion', write('hex-motion.csv', motion.join('\r\n'))], /hex-motion\.csv.*row 4.*non-numeric value "0x10"/);
    const pendulum = readFileSync(join(fixtures, 'pendulum', 'healthy-100hz.csv'), 'utf8').split(/\r?\n/);
    pendulum[3] = pendulum[3]!.replace(/,[^,]*$/, ',0x10');
    await expectRefusal(['pendulum', write('hex-pendulum.csv', pendulum.join('\n'))], /hex-pendulum\.csv.*row 4.*non-numeric value "0x10"/);
    await expectRefusal(['cohort', backup, '--out', 'o1', '--dates', 'shifted', '--max-shift-days', '99999999999999999999'], /--max-shift-days "99999999999999999999": expected a whole number from 1 to 3650/);
    await expectRefusal(['cohort', backup, '--out', 'o1', '--event', 'botulinum-toxin-injection', '--baseline-max-days', '0x10'], /--baseline-max-days "0x10"/);
    await expectRefusal(['demo', '--out', 'd.json', '--end', '2025-02-30'], /--end: 2025-02-30 does not exist in the calendar/);
    await expectRefusal(['demo', '--out', 'd.json', '--end', '0001-01-01'], /--end: 0001-01-01 is outside 2003-01-01 to 2100-12-31/);
    await expectRefusal(['cohort', backup, '--out', 'o1', '--from', '2025-13-01'], /--from: 2025-13-01 does not exist/);
    await expectRefusal(['serve', '--port', '1e400'], /--port "1e400"/);
    await expectRefusal(['pendulum', join(fixtures, 'pendulum', 'healthy-100hz.csv'), '--start-angle', '0x10'], /--start-angle "0x10"/);
    expect(existsSync(join(scratch, 'd.json'))).toBe(false);
    expect(existsSync(join(scratch, 'o1'))).toBe(false);
  });

  it('reliability: a duplicated subject id and a table without a header', async () => {
    await expectRefusal(['reliability', write('dup.csv', 'subject,t1,t2\nA,1,2\nB,2,3\nA,1,2\nC,4,4\n')], /dup\.csv: line 4: subject "A" appears again \(first on line 2\)/);
    await expectRefusal(['reliability', write('headerless.csv', 'A,1,2\nB,2,3\nC,4,4\n')], /headerless\.csv: line 1: the first row holds numbers where the header should name the trials/);
  });

  it('a UTF-8 byte-order mark is read as the browser reads it', async () => {
    const text = readFileSync(join(scratch, backup), 'utf8');
    const withMark = write('bom.json', `\uFEFF${text}`);
    const { status, stderr } = await run(['cohort', withMark, '--out', 'bom-out']);
    expect(stderr).toEqual([]);
    expect(status).toBe(0);
    const table = write('bom.csv', '\uFEFFsubject,t1,t2\nA,1,2\nB,2,4\nC,4,4\n');
    expect((await run(['reliability', table])).status).toBe(0);
  });

  it('an output path that is a folder is refused before anything is written', async () => {
    mkdirSync(join(scratch, 'folder.json'));
    await expectRefusal(['demo', '--out', 'folder.json'], /folder\.json: is a folder; give a file name/);
    mkdirSync(join(scratch, 'blocked', 'kinnote-cohort-wide.csv'), { recursive: true });
    await expectRefusal(['cohort', backup, '--out', 'blocked'], /blocked\/kinnote-cohort-wide\.csv: is a folder/);
    expect(readdirSync(join(scratch, 'blocked'))).toEqual(['kinnote-cohort-wide.csv']);
    await expectRefusal(['motion', join(fixtures, 'sensors', 'healthy-phone-60hz.csv'), '--trace', 'folder.json'], /folder\.json: is a folder/);
  });

  it('serve: a port in use is refused in one line', async () => {
    const site = join(scratch, 'site');
    mkdirSync(site);
    writeFileSync(join(site, 'index.html'), '<!doctype html><title>t</title>');
    const blocker = createServer();
    await new Promise<void>((done) => blocker.listen(0, '127.0.0.1', () => done()));
    const port = (blocker.address() as { port: number }).port;
    try {
      await expectRefusal(['serve', '--port', String(port), '--dir', site], new RegExp(`--port ${port}: 127\\.0\\.0\\.1:${port} is in use by another program`));
    } finally {
      await new Promise<void>((done) => blocker.close(() => done()));
    }
  });
});

/** A 64 kB file system, to fill up; needs the right to mount (root on the CI machine), else the test is skipped. */
function smallDisk(): string | null {
  const dir = mkdtempSync(join(tmpdir(), 'kinnote-full-'));
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', dir], { stdio: 'ignore' });
    return dir;
  } catch {
    return null;
  }
}
const disk = smallDisk();
afterAll(() => {
  if (disk) execFileSync('umount', [disk]);
});

describe.skipIf(disk === null)('a full disk', () => {
  it('cohort: exit 1, one line, no file left behind and no success reported', async () => {
    const { status, stdout, stderr } = await run(['cohort', backup, '--out', join(disk!, 'cohort')]);
    expect({ status, stdout }).toEqual({ status: 1, stdout: '' });
    expect(stderr).toHaveLength(1);
    expect(stderr[0]).toMatch(/kinnote-cohort-\w+\.(csv|json): cannot write the file \(ENOSPC\); nothing was written/);
    expect(readdirSync(join(disk!, 'cohort'))).toEqual([]);
  });

  it('demo: exit 1 and no partial file', async () => {
    await expectRefusal(['demo', '--out', join(disk!, 'demo.json')], /demo\.json: cannot write the file \(ENOSPC\)/);
    expect(readdirSync(disk!).filter((f) => f !== 'cohort')).toEqual([]);
  });
});
