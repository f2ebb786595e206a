/** Entry point of the `inkroute` CLI (bin/inkroute.js loads it); the commands are in program.ts. */
import { runCli } from './program.ts';

// exitCode rather than exit(), so that piped output is flushed before Node quits.
process.exitCode = await runCli(process.argv);
