import { type CliIo } from './command';

/** Reads and parses a JSON file for a command; on failure prints one line and returns null (exit 2). */
export function readJsonArg(io: CliIo, file: string): { value: unknown } | null {
  let text: string;
  try {
    text = io.readText(file);
  } catch (e) {
    io.err(`error: cannot read ${file}: ${(e as Error).message}`);
    return null;
  }
  try {
    // A byte-order mark, as some editors on Windows save a file, is no part of the JSON.
    return { value: JSON.parse(text.replace(/^\uFEFF/, '')) as unknown };
  } catch (e) {
    io.err(`error: ${file} is not valid JSON: ${(e as Error).message}`);
    return null;
  }
}
