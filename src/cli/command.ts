import { readCalendarDate, readDecimal, readWholeNumber } from '../lib/domain';
/** What every `kinnote` command provides. Commands live in src/cli/commands, one per file. */
export interface CliIo {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  readonly env: Readonly<Record<string, string | undefined>>;
  readonly cwd: string;
}

export interface CliCommand {
  readonly name: string;
  /** One line for `kinnote --help`. */
  readonly summary: string;
  /** Usage text for `kinnote <name> --help`. */
  readonly usage: string;
  /** Returns the exit status. Throw RefusedInput for bad input; main prints it as one line. */
  readonly run: (args: readonly string[], io: CliIo) => Promise<number>;
}

/**
 * Input the command refuses. The message names the file, row and reason; main prints it on one
 * line on stderr, prints nothing on stdout, and exits with status 1.
 */
export class RefusedInput extends Error {
  override readonly name = 'RefusedInput';
}

/** Splits `--flag value` and `--switch` options from positional arguments. */
export function parseOptions(
  args: readonly string[],
  valueFlags: readonly string[],
  switchFlags: readonly string[] = [],
): { positional: string[]; values: Map<string, string>; switches: Set<string> } {
  const positional: string[] = [];
  const values = new Map<string, string>();
  const switches = new Set<string>();
  for (let i = 0; i < args.length; i++) {
    const arg = args[i] as string;
    if (arg.startsWith('--')) {
      const eq = arg.indexOf('=');
      const flag = eq > 0 ? arg.slice(2, eq) : arg.slice(2);
      if (valueFlags.includes(flag)) {
        const value = eq > 0 ? arg.slice(eq + 1) : args[++i];
        if (value === undefined) throw new RefusedInput(`option --${flag} needs a value`);
        values.set(flag, value);
      } else if (switchFlags.includes(flag)) {
        switches.add(flag);
      } else {
        throw new RefusedInput(`unknown option ${arg}`);
      }
    } else {
      positional.push(arg);
    }
  }
  return { positional, values, switches };
}

/**
 * Option readers shared by every command, all on the domain's one number and date reader
 * (hexadecimal, overflow, impossible dates refused alike). Each returns undefined when the option
 * was not given and throws RefusedInput naming the option otherwise.
 */
export function optionWholeNumber(text: string | undefined, flag: string, min: number, max: number): number | undefined {
  if (text === undefined) return undefined;
  const reading = readWholeNumber(text, min, max);
  if (!reading.ok) throw new RefusedInput(`--${flag} "${text.slice(0, 40)}": ${reading.reason}`);
  return reading.value;
}

export function optionDecimal(text: string | undefined, flag: string, min: number, max: number): number | undefined {
  if (text === undefined) return undefined;
  const reading = readDecimal(text);
  if (!reading.ok || reading.value < min || reading.value > max) throw new RefusedInput(`--${flag} "${text.slice(0, 40)}": expected a decimal number from ${min} to ${max}`);
  return reading.value;
}

export function optionDate(text: string | undefined, flag: string, earliest = '1900-01-01', latest = '2100-12-31'): string | undefined {
  if (text === undefined) return undefined;
  const reading = readCalendarDate(text, earliest, latest);
  if (!reading.ok) throw new RefusedInput(`--${flag}: ${reading.reason}`);
  return reading.value;
}
