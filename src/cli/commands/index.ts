import type { CliCommand } from '../command';
import { serveCommand } from './serve';
import { demoCommand } from './demo';
import { reliabilityCommand } from './reliability';
import { pendulumCommand } from './pendulum';
import { cohortCommand } from './cohort';
import { motionCommand } from './motion';
import { teamServerCommand } from './team-server';

/** Every command of `kinnote`; add a command by adding one file and one line here. */
export const commands: readonly CliCommand[] = [serveCommand, pendulumCommand, reliabilityCommand, demoCommand, cohortCommand, motionCommand, teamServerCommand];
