/**
 * The `inkroute` command line: the commands and how failures are reported. Every failure a person can cause ends as one line on
 * stderr, prefixed `inkroute: `, with exit code 2; faults of inkroute itself exit 1.
 * Set INKROUTE_DEBUG=1 to see stack traces.
 */
import { Command, CommanderError } from 'commander';
import { ImageFormatError } from '../image/codec.ts';
import { CliError } from './errors.ts';

const PREFIX = 'inkroute: ';

function collect(value: string, previous: string[]): string[] {
  return [...previous, value];
}

/** Commander's messages, reduced to one line with our prefix. */
export function formatCommanderError(text: string): string {
  return PREFIX + text.replace(/^error:\s*/, '').replace(/\s*\n\s*/g, ' ').trim() + '\n';
}

export function createProgram(): Command {
  const program = new Command('inkroute');
  program
    .description('Trace faded ink inscriptions stroke by stroke, with ground truth to score against.')
    .version('0.1.0')
    .configureOutput({ outputError: (text, write) => write(formatCommanderError(text)) })
    // Throw instead of exiting so that runCli picks the exit code.
    .exitOverride();

  program
    .command('synth')
    .description('make a demo or test inscription with its ground truth')
    .option('--seed <n>', 'seed of the generator, a whole number')
    .requiredOption('--out <dir>', 'folder to write visible.png, truth.json, scale.json, ink-mask.png into')
    .option('--difficulty <level>', 'easy, medium or hard')
    .option('--bands <n>', '1 (visible) or 2 (visible and infrared)')
    .option('--demo', 'use the built-in demo inscription')
    .option('--if-missing', 'do nothing when the folder already holds this seed')
    .action(async (options) => {
      const { runSynth } = await import('./synth.ts');
      await runSynth(options);
    });

  program
    .command('follow')
    .description('solve one stroke between two points on an image')
    .argument('<image>', 'PNG or JPEG file')
    .option('--from <x,y>', 'start of the stroke, px')
    .option('--to <x,y>', 'end of the stroke, px')
    .option('--via <x,y>', 'an anchor the stroke passes through, px (repeatable)', collect, [])
    .option('--radius <min,max>', 'range of pen radii, px')
    .option('--adherence <a>', 'weight of "stay on ink"')
    .option('--width-change <w>', 'weight of "steady width"')
    .option('--curvature <c>', 'weight of "smooth turns"')
    .option('--polarity <p>', 'dark (ink darker than the surface, default) or light')
    .option('--json', 'print the stroke as JSON {samples, restoredSpans, cost}')
    .action(async (image: string, options) => {
      const { runFollow } = await import('./follow.ts');
      await runFollow(image, options);
    });

  program
    .command('score')
    .description('compare a traced result with ground truth')
    .argument('<result>', 'a stroke {samples, restoredSpans, cost} or {strokes: [...]}, JSON')
    .argument('<truth>', 'truth.json written by inkroute synth')
    .action(async (result: string, truth: string) => {
      const { runScore } = await import('./score.ts');
      runScore(result, truth);
    });

  program
    .command('bench')
    .description('run the solver benchmark')
    .option('--quick', 'a short run for a first look')
    .action(async (options) => {
      const { runBenchCommand } = await import('./bench.ts');
      await runBenchCommand(options);
    });

  return program;
}

/** Runs the CLI on `argv` (as process.argv) and returns the exit code. */
export async function runCli(argv: string[]): Promise<number> {
  try {
    await createProgram().parseAsync(argv);
    return 0;
  } catch (e) {
    if (e instanceof CommanderError) {
      if (e.code === 'commander.helpDisplayed' || e.code === 'commander.version') return 0;
      // Commander has printed its message (or the help, for a missing command) already.
      return 2;
    }
    if (process.env.INKROUTE_DEBUG) process.stderr.write(`${(e as Error).stack}\n`);
    if (e instanceof CliError) {
      process.stderr.write(PREFIX + e.message + '\n');
      return e.exitCode;
    }
    if (e instanceof ImageFormatError) {
      process.stderr.write(PREFIX + e.message + '\n');
      return 2;
    }
    process.stderr.write(`${PREFIX}internal error: ${(e as Error).message ?? String(e)}\n`);
    return 1;
  }
}
