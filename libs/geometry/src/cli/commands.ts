import { buildCommand } from './build-command';
import { type CliCommand } from './command';
import { nestCommand } from './nest-command';
import { couponCommand, packCommand } from './pack-command';

/**
 * The subcommand table. To add a subcommand, write a CliCommand in its own file and list it here.
 */
export const COMMANDS: readonly CliCommand[] = [buildCommand, nestCommand, packCommand, couponCommand];
