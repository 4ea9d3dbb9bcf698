import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../../src/cli/main';
import { readBackup } from '../../../src/lib/store';

function capture(cwd: string) {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { stdout: (t: string) => out.push(t), stderr: (t: string) => err.push(t), env: {}, cwd }, out, err };
}

describe('kinnote demo', () => {
  const dir = mkdtempSync(join(tmpdir(), 'kinnote-demo-'));

  it('writes a valid, reproducible backup bundle', async () => {
    const a = capture(dir);
    expect(await runCli(['demo', '--out', 'a.json', '--seed', '5'], a.io)).toBe(0);
    const b = capture(dir);
    expect(await runCli(['demo', '--out', 'b.json', '--seed', '5'], b.io)).toBe(0);
    const c = capture(dir);
    expect(await runCli(['demo', '--out', 'c.json', '--seed', '6'], c.io)).toBe(0);
    const textA = readFileSync(join(dir, 'a.json'), 'utf8');
    expect(readFileSync(join(dir, 'b.json'), 'utf8')).toBe(textA);
    expect(readFileSync(join(dir, 'c.json'), 'utf8')).not.toBe(textA);
    const summary = JSON.parse(a.out.join('')) as { seed: number; counts: Record<string, number>; checksum: string };
    expect(summary.seed).toBe(5);
    expect(summary.counts.patients).toBe(12);
    const verified = await readBackup(textA);
    expect(verified.checksum).toBe(summary.checksum);
    expect(verified.tables.observations.length).toBe(summary.counts.observations);
  });

  it('refuses bad options with one line on stderr and nothing on stdout', async () => {
    for (const args of [['demo'], ['demo', '--out', 'x.json', '--seed', 'abc'], ['demo', '--out', 'x.json', '--end', '2025-13-45x'], ['demo', '--out', join(dir, 'no/such/dir/x.json')]]) {
      const r = capture(dir);
      expect(await runCli(args, r.io), args.join(' ')).toBe(1);
      expect(r.out).toEqual([]);
      expect(r.err).toHaveLength(1);
      expect(r.err[0]).toMatch(/^kinnote demo: /);
    }
  });
});
