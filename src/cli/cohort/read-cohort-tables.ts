import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { createInterface } from 'node:readline';
import { Writable } from 'node:stream';
import { readBackup, StoreError } from '../../lib/store';
import { pullTeamSnapshot } from '../../lib/sync';
import { RefusedInput, type CliIo } from '../command';
import type { CohortOptions } from './cohort-options';

/** Reads a passphrase from the terminal without echoing it. */
async function promptPassphrase(): Promise<string> {
  const muted = new Writable({ write: (_chunk, _encoding, done) => done() });
  process.stderr.write('Passphrase for the encrypted backup: ');
  const rl = createInterface({ input: process.stdin, output: muted, terminal: true });
  try {
    return await new Promise<string>((resolvePromise) => rl.question('', resolvePromise));
  } finally {
    rl.close();
    process.stderr.write('\n');
  }
}

async function passphraseFor(text: string, io: CliIo): Promise<string | undefined> {
  if (!text.includes('"kinnote-backup-encrypted"')) return undefined;
  const fromEnv = io.env.KINNOTE_PASSPHRASE;
  if (fromEnv !== undefined && fromEnv !== '') return fromEnv;
  if (process.stdin.isTTY && process.stderr.isTTY) return promptPassphrase();
  return undefined;
}

/**
 * Step 2 of `kinnote cohort`: the records, from the team server (with a device token: no identities,
 * no notes, as an auditor sees them) or from a backup file (decrypted with KINNOTE_PASSPHRASE or a
 * prompt). RefusedInput names the file and what went wrong.
 */
export async function readCohortTables(options: CohortOptions, io: CliIo) {
  const { server, file } = options;
  let passphrase: string | undefined;
  try {
    if (server !== undefined) {
      const token = io.env.KINNOTE_TOKEN;
      if (!token) throw new RefusedInput('--server needs a device token in KINNOTE_TOKEN');
      return (await pullTeamSnapshot(server, token, { fetch: globalThis.fetch, now: Date.now })).tables;
    }
    let text: string;
    try {
      text = await readFile(resolve(io.cwd, file), 'utf8');
    } catch (error) {
      throw new RefusedInput(`${file}: cannot read the file (${(error as NodeJS.ErrnoException).code ?? String(error)})`);
    }
    passphrase = await passphraseFor(text, io);
    return (await readBackup(text, passphrase === undefined ? {} : { passphrase })).tables;
  } catch (error) {
    if (error instanceof StoreError) {
      const hint = error.code === 'WrongPassphrase' && passphrase === undefined ? ' (set KINNOTE_PASSPHRASE)' : '';
      throw new RefusedInput(`${file}: ${error.message}${hint}`);
    }
    if ((error as Error).name === 'TeamSyncError') throw new RefusedInput(`${file}: ${(error as Error).message}`);
    throw error;
  }
}
