import type { CliCommand } from '../command';
import { serveCommand } from './serve';

/** Every command of `kinnote`; add a command by adding one file and one line here. */
export const commands: readonly CliCommand[] = [serveCommand];
