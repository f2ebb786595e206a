/** Running the `inkroute` command line in tests, and what every CLI error must look like. */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import { UsageError } from '../../src/cli/errors.ts';

const BIN = fileURLToPath(new URL('../../bin/inkroute.js', import.meta.url));

export interface CliRun {
  code: number | null;
  stdout: string;
  stderr: string;
}

/** Runs bin/inkroute.js with `args` in a child Node process. */
export function inkroute(...args: string[]): CliRun {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', timeout: 180_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Asserts a one-line `inkroute: ` error with exit code 2 and no stack trace. */
export function expectUsageError(r: CliRun, message: string | RegExp): void {
  expect(r.code).toBe(2);
  expect(r.stderr.endsWith('\n')).toBe(true);
  expect(r.stderr.trimEnd().split('\n'), r.stderr).toHaveLength(1);
  expect(r.stderr.startsWith('inkroute: ')).toBe(true);
  expect(r.stderr).not.toMatch(/^\s+at /m);
  expect(r.stderr).toMatch(message);
}

/** The message of the UsageError `fn` throws (and fails when it throws none or another). */
export function usage(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(UsageError);
    return (e as Error).message;
  }
  throw new Error('expected a UsageError');
}
