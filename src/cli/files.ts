/** File access for the CLI, turning the system's errors into one readable sentence. */
import { readFileSync } from 'node:fs';
import { UsageError } from './errors.ts';

function reason(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EISDIR') return 'it is a directory';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  return (e as Error).message;
}

/** Reads a whole file; a missing or unreadable file is a {@link UsageError}. */
export function readInput(path: string): Uint8Array {
  try {
    return readFileSync(path);
  } catch (e) {
    throw new UsageError(`cannot read ${path}: ${reason(e)}`);
  }
}

/** Reads and parses a JSON file; malformed JSON is a {@link UsageError}. */
export function readJson(path: string): unknown {
  const text = new TextDecoder().decode(readInput(path));
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new UsageError(`${path} is not valid JSON (${(e as Error).message})`);
  }
}

/** Describes a write failure in the same words as a read failure. */
export function writeFailure(path: string, e: unknown): UsageError {
  return new UsageError(`cannot write ${path}: ${reason(e)}`);
}
