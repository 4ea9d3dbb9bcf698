import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../../src/cli/main';
import { startStaticServer } from '../../../src/cli/commands/serve';

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return {
    out,
    err,
    io: { stdout: (t: string) => out.push(t), stderr: (t: string) => err.push(t), env: {}, cwd: process.cwd() },
  };
}

describe('kinnote command', () => {
  it('--help lists every command with its summary', async () => {
    const c = capture();
    expect(await runCli(['--help'], c.io)).toBe(0);
    expect(c.out.join('\n')).toMatch(/^\s+serve\s+serve the production build/m);
    expect(c.err).toEqual([]);
  });

  it('an unknown command exits 1 with one line on stderr and nothing on stdout', async () => {
    const c = capture();
    expect(await runCli(['frobnicate'], c.io)).toBe(1);
    expect(c.out).toEqual([]);
    expect(c.err).toHaveLength(1);
    expect(c.err[0]).toContain('frobnicate');
  });

  it('refuses a bad option as one line naming it', async () => {
    const c = capture();
    expect(await runCli(['serve', '--port', 'eighty'], c.io)).toBe(1);
    expect(c.out).toEqual([]);
    expect(c.err[0]).toMatch(/--port.*eighty/);
  });
});

describe('static server behind `kinnote serve`', () => {
  let dir: string;
  let server: Awaited<ReturnType<typeof startStaticServer>>;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'kinnote-serve-'));
    mkdirSync(join(dir, 'site', '_app', 'immutable'), { recursive: true });
    writeFileSync(join(dir, 'site', 'index.html'), '<!doctype html><title>shell</title>');
    writeFileSync(join(dir, 'site', 'sw.js'), 'self.x = 1;');
    writeFileSync(join(dir, 'site', '_app', 'immutable', 'a.js'), 'export {};');
    writeFileSync(join(dir, 'secret.txt'), 'outside the served folder');
    server = await startStaticServer(join(dir, 'site'), 0);
  });
  afterAll(async () => {
    await server?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('answers unknown paths with the app shell (single-page fallback)', async () => {
    const response = await fetch(`${server.url}/patients/some-code`);
    expect(response.status).toBe(200);
    expect(await response.text()).toContain('<title>shell</title>');
  });

  it('serves the worker uncached and hashed assets as immutable', async () => {
    const sw = await fetch(`${server.url}/sw.js`);
    expect(sw.headers.get('content-type')).toMatch(/javascript/);
    expect(sw.headers.get('cache-control')).toBe('no-cache');
    const asset = await fetch(`${server.url}/_app/immutable/a.js`);
    expect(asset.headers.get('cache-control')).toContain('immutable');
  });

  it('never serves a file outside its folder', async () => {
    for (const path of ['/../secret.txt', '/%2e%2e/secret.txt', '/..%2fsecret.txt']) {
      const text = await (await fetch(`${server.url}${path}`)).text();
      expect(text, path).not.toContain('outside the served folder');
    }
  });

  it('refuses a folder without index.html', async () => {
    await expect(startStaticServer(join(dir, 'nowhere'), 0)).rejects.toThrow(/index\.html: not found/);
  });
});
