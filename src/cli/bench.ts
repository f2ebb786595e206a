/** `inkroute bench`: runs the benchmark module, which lives beside the engine in src/bench. */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { CliError } from './errors.ts';

export const BENCH_MODULE = new URL('../bench/run.ts', import.meta.url);

export interface BenchModule {
  runBench(options: { quick: boolean }): unknown;
}

/**
 * Loads the benchmark module. A missing file is reported plainly; an error inside an
 * existing module is passed on, so that it is not mistaken for absence.
 */
export async function loadBench(url: URL = BENCH_MODULE): Promise<BenchModule> {
  if (!existsSync(fileURLToPath(url))) {
    throw new CliError(`the benchmark is not in this checkout (${fileURLToPath(url)} is missing)`);
  }
  const mod = (await import(url.href)) as Partial<BenchModule>;
  if (typeof mod.runBench !== 'function') throw new CliError(`${fileURLToPath(url)} does not export runBench`);
  return mod as BenchModule;
}

export async function runBenchCommand(options: { quick?: boolean }): Promise<void> {
  const bench = await loadBench();
  await bench.runBench({ quick: Boolean(options.quick) });
}
