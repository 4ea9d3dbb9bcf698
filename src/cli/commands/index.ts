import type { CliCommand } from '../command';
import { serveCommand } from './serve';
import { reliabilityCommand } from './reliability';
import { pendulumCommand } from './pendulum';

/** Every command of `kinnote`; add a command by adding one file and one line here. */
export const commands: readonly CliCommand[] = [serveCommand, pendulumCommand, reliabilityCommand];
