#!/usr/bin/env node
/**
 * Command-line entry: `kerfwright <command> …` (from the repo root: `npm run -s cli -- build SPEC.json
 * --out DIR`). The only module of this package that touches the file system.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { COMMANDS } from './cli/commands';
import { type CliIo, UsageError } from './cli/command';

/**
 * mkdir -p, one level at a time from the deepest folder that exists. Node's own recursive mkdirSync never
 * returns under a file system that answers "no such file" for a folder it cannot create (for example /proc).
 */
export function makeDirs(dir: string): void {
  const missing: string[] = [];
  let at = path.resolve(dir);
  while (!fs.existsSync(at)) {
    missing.push(at);
    const parent = path.dirname(at);
    if (parent === at) break;
    at = parent;
  }
  for (const d of missing.reverse()) fs.mkdirSync(d);
}

/** The file system as the commands see it (stdout, stderr, files and folders). */
export const fileSystemIo: CliIo = {
  out: (t) => process.stdout.write(t.endsWith('\n') ? t : t + '\n'),
  err: (t) => process.stderr.write(t.endsWith('\n') ? t : t + '\n'),
  readText: (p) => fs.readFileSync(p, 'utf8'),
  writeText: (p, t) => fs.writeFileSync(p, t),
  writeBytes: (p, d) => fs.writeFileSync(p, d),
  makeDir: (p) => makeDirs(p),
  joinPath: (...parts) => path.join(...parts),
  listFiles: (dir) =>
    fs.existsSync(dir)
      ? fs
          .readdirSync(dir, { withFileTypes: true })
          .filter((e) => e.isFile())
          .map((e) => e.name)
      : [],
  removeStale: (dir, pattern, keep) => {
    const removed: string[] = [];
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      if (!entry.isFile() || !pattern.test(entry.name) || keep.has(entry.name)) continue;
      fs.unlinkSync(path.join(dir, entry.name));
      removed.push(entry.name);
    }
    return removed;
  },
};

function help(): string {
  return [
    'usage: kerfwright <command> [arguments]',
    '',
    ...COMMANDS.map((c) => `  ${c.usage.padEnd(40)} ${c.summary}`),
  ].join('\n');
}

/** Runs one command line; returns the exit code. */
export async function main(argv: readonly string[], cliIo: CliIo = fileSystemIo): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    cliIo.out(help());
    return name ? 0 : 2;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) {
    cliIo.err(`error: unknown command "${name}" (commands: ${COMMANDS.map((c) => c.name).join(', ')})`);
    return 2;
  }
  try {
    return await command.run(rest, cliIo);
  } catch (e) {
    if (e instanceof UsageError) {
      cliIo.err(`error: ${e.message}`);
      return 2;
    }
    // A file system refusal (an --out that cannot be made or written): the user's to fix, like a usage error.
    const code = (e as NodeJS.ErrnoException).code;
    if (typeof code === 'string' && /^E[A-Z]+$/.test(code)) {
      cliIo.err(`error: cannot write the output: ${(e as Error).message}`);
      return 2;
    }
    cliIo.err(`error: internal failure: ${(e as Error).message}`);
    return 3;
  }
}

if (require.main === module) {
  main(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`error: ${(e as Error).message}\n`);
      process.exitCode = 3;
    },
  );
}
