import { commands } from './commands/index';
import { RefusedInput, type CliIo } from './command';

/** Runs one `kinnote` invocation and returns its exit status. */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    const width = Math.max(...commands.map((c) => c.name.length));
    io.stdout(
      [
        'kinnote <command> [options]',
        '',
        'Commands:',
        ...commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
        '',
        'Each command prints JSON on stdout (CSV with --csv where offered). Refused input exits',
        'with status 1 and one line on stderr naming the file, row and reason.',
      ].join('\n'),
    );
    return name === undefined ? 1 : 0;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    io.stderr(`kinnote: unknown command "${name}"; run kinnote --help for the list`);
    return 1;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(command.usage);
    return 0;
  }
  try {
    return await command.run(rest, io);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    io.stderr(`kinnote ${name}: ${message.replace(/\s*\n\s*/g, ' ')}`);
    return error instanceof RefusedInput ? 1 : 2;
  }
}

const isMain = process.argv[1] !== undefined && import.meta.url.endsWith(process.argv[1].replace(/\\/g, '/'));
if (isMain) {
  const status = await runCli(process.argv.slice(2), {
    stdout: (text) => process.stdout.write(text.endsWith('\n') ? text : `${text}\n`),
    stderr: (text) => process.stderr.write(text.endsWith('\n') ? text : `${text}\n`),
    env: process.env,
    cwd: process.cwd(),
  });
  process.exitCode = status;
}
