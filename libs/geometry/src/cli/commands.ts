import { buildCommand } from './build-command';
import { type CliCommand } from './command';

/**
 * The subcommand table. To add a subcommand (nest, pack, coupon…), write a CliCommand in its own file
 * and list it here.
 */
export const COMMANDS: readonly CliCommand[] = [buildCommand];
