// A team-server process on 127.0.0.1 for the load runs and the browser test: started through the
// `kinnote` command exactly as a person starts it, stopped (or killed) by its own pid.
import { spawn, type ChildProcess } from 'node:child_process';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const ROOT = resolve(import.meta.dirname, '../..');
const TSX_LOADER = pathToFileURL(join(ROOT, 'node_modules/tsx/dist/loader.mjs')).href;

/** `kinnote team-server …` as a child process; start() resolves with its address once it listens. */
export class ServerProcess {
  url = '';
  private child: ChildProcess | undefined;
  constructor(private readonly args: string[], private readonly env: NodeJS.ProcessEnv) {}
  async start(): Promise<void> {
    // Node itself runs the server (tsx as a loader), not tsx's command: that one starts the server as
    // its own child, so a SIGKILL sent to it would leave the server running on as an orphan.
    const child = spawn(process.execPath, ['--import', TSX_LOADER, join(ROOT, 'src/cli/main.ts'), 'team-server', ...this.args], {
      env: this.env,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    this.child = child;
    let err = '';
    child.stderr!.on('data', (d) => (err += String(d)));
    this.url = await new Promise<string>((ok, fail) => {
      let out = '';
      child.stdout!.on('data', (d) => {
        out += String(d);
        const m = /"url":"([^"]+)"/.exec(out);
        if (m) ok(m[1]!);
      });
      child.once('exit', (code) => fail(new Error(`team-server exited (${code}) before listening: ${err}`)));
    });
  }
  kill(): Promise<void> {
    const child = this.child!;
    return new Promise((ok) => {
      child.once('exit', () => ok());
      child.kill('SIGKILL');
    });
  }
  async stop(): Promise<void> {
    if (this.child && this.child.exitCode === null) {
      await new Promise<void>((ok) => {
        this.child!.once('exit', () => ok());
        this.child!.kill('SIGTERM');
      });
    }
  }
}

/** Runs one `kinnote` command to its end; resolves with its stdout, rejects with its stderr. */
export async function runCli(args: string[], env: NodeJS.ProcessEnv): Promise<string> {
  const child = spawn(process.execPath, [join(ROOT, 'node_modules/tsx/dist/cli.mjs'), join(ROOT, 'src/cli/main.ts'), ...args], { env, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stdout.on('data', (d) => (out += String(d)));
  child.stderr.on('data', (d) => (err += String(d)));
  const code = await new Promise<number | null>((ok) => child.once('exit', ok));
  if (code !== 0) throw new Error(`kinnote ${args.join(' ')} failed: ${err}`);
  return out;
}
