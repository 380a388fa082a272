import { runNestCommand } from '../nest';
import { type CliRun, UsageError, parseArgs } from './command';
import { readJsonArg } from './read-json';

/**
 * `nest PARTS.json`: nests the parts on sheets (see runNestCommand for the input) and prints the result
 * as JSON on stdout. Exit codes: 0 nested; 1 the output carries an `error` (invalid input, a part that
 * fits no sheet); 2 unreadable JSON or bad arguments.
 */
export const runNest: CliRun = (args, io, usage) => {
  const { positional } = parseArgs(args, [], []);
  const [file, extra] = positional;
  if (!file || extra !== undefined) throw new UsageError(`usage: ${usage}`);
  const input = readJsonArg(io, file);
  if (!input) return 2;
  const output = runNestCommand(input.value);
  io.out(JSON.stringify(output, null, 2));
  if (output.error) {
    io.err(`error: ${output.error.code}: ${output.error.message}`);
    return 1;
  }
  return 0;
};
