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
    .option('--out <dir>', 'folder to write visible.png, truth.json, scale.json, ink-mask.png into')
    .option('--project <file>', 'write the finished example project (every stroke traced, letters made) as FILE.inkroute')
    .option('--difficulty <level>', 'easy, medium or hard')
    .option('--bands <n>', '1 (visible) or 2 (visible and infrared)')
    .option('--demo', 'use the built-in demo inscription')
    .option('--if-missing', 'do nothing when the folder or project file already holds this seed')
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
    .command('export')
    .description('write the facsimile, letter set, paleographic chart, transcription or annotations of a project')
    .argument('<project>', 'a project file, NAME.inkroute')
    .option('--svg <file>', 'the facsimile as SVG')
    .option('--png <file>', 'the facsimile as PNG')
    .option('--dpi <n>', 'dots per inch of the PNG: 300 (default), 600, 1200')
    .option('--transparent', 'PNG on a transparent background instead of white')
    .option('--letters <file>', 'the letter set, a zip with letters.csv, letters.json and a folder per letter')
    .option('--chart <file>', 'the paleographic chart as SVG')
    .option('--tei <file>', 'the transcription as TEI XML')
    .option('--annotations <file>', 'the letters as W3C Web Annotations, JSON-LD')
    .option('--scale <n>', 'drawing size against the object: 1 is 1:1, 2 is 2:1 (default 1)')
    .option('--scale-bar <mm>', 'length of the scale bar, mm; 0 for none (default a round length near a fifth of the width)')
    .option('--restored <style>', 'restored spans drawn dashed (default) or grey')
    .option('--labels', 'letter labels beside their letters')
    .option('--line-numbers', 'line numbers in the margin')
    .option('--photo [band]', 'the photo under the drawing (default the first band)')
    .option('--margin <mm>', 'margin around each letter of the letter set, mm (default 2)')
    .option('--surface <name>', 'surface to export (default the first)')
    .action(async (project: string, options) => {
      const { runExport } = await import('./export.ts');
      await runExport(project, options);
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
