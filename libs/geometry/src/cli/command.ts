/** What a CLI subcommand gets: its arguments and the process's streams and file system. */
export interface CliIo {
  out: (text: string) => void;
  err: (text: string) => void;
  readText: (path: string) => string;
  writeText: (path: string, text: string) => void;
  writeBytes: (path: string, data: Uint8Array) => void;
  makeDir: (path: string) => void;
  joinPath: (...parts: string[]) => string;
  /**
   * Removes the files in `dir` whose names match `pattern` and are not in `keep` (what an earlier run into the
   * same folder wrote and this one does not replace); returns their names. Optional: without it nothing is
   * removed.
   */
  removeStale?: (dir: string, pattern: RegExp, keep: ReadonlySet<string>) => string[];
  /** Names of the files in `dir` ([] when it does not exist). Optional: without it a folder looks empty. */
  listFiles?: (dir: string) => string[];
}

/** Tells the user which files of an earlier run into the same folder were removed. */
export function removeStaleOutputs(io: CliIo, dir: string, pattern: RegExp, keep: ReadonlySet<string>): void {
  const removed = io.removeStale?.(dir, pattern, keep) ?? [];
  if (removed.length > 0)
    io.err(
      `removed ${removed.length} file${removed.length === 1 ? '' : 's'} an earlier run left in ${dir}: ` +
        removed.sort().join(', '),
    );
}

/** One subcommand of `kerfwright` (build, nest, pack, coupon: the table in commands.ts). Returns the exit code. */
export interface CliCommand {
  name: string;
  /** One line for the help text. */
  summary: string;
  usage: string;
  run(args: readonly string[], io: CliIo): number | Promise<number>;
}

/**
 * The work behind one command of the table in commands.ts, exported by the command's own module; `usage` is
 * the table's usage line, for UsageError messages.
 */
export type CliRun = (args: readonly string[], io: CliIo, usage: string) => number | Promise<number>;

/** Thrown for bad command-line use; printed as one line with exit code 2. */
export class UsageError extends Error {}

/** Splits `--flag value`, `--flag=value` and bare `--switch` options from positional arguments. */
export function parseArgs(
  args: readonly string[],
  valued: readonly string[],
  switches: readonly string[],
): { positional: string[]; options: Map<string, string | true> } {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < args.length; i++) {
    const a = args[i] as string;
    if (!a.startsWith('--')) {
      positional.push(a);
      continue;
    }
    const [name, inline] = a.slice(2).split(/=(.*)/s, 2) as [string, string | undefined];
    if (valued.includes(name)) {
      const v = inline ?? args[++i];
      if (v === undefined) throw new UsageError(`--${name} needs a value`);
      options.set(name, v);
    } else if (switches.includes(name) && inline === undefined) {
      options.set(name, true);
    } else throw new UsageError(`unknown option --${name}`);
  }
  return { positional, options };
}
