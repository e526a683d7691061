#!/usr/bin/env node
// Entry point: runs the program (src/cli/run.ts decides the exit code and the one line on stderr) and handles
// the process's own events: Ctrl-C (SIGINT) and SIGTERM stop the run, remove any output file still being written
// and exit 130 (143); a closed stdout (`trimfree values E192 | head`) ends the run quietly.
// The signal handlers are installed first thing, before the program and its commands are loaded (a tenth of a
// second), so a Ctrl-C at any moment ends the same way; only output-file.js, which they need, is loaded before.
import { removePendingTemporaries } from './output-file.js';

function onSignal(signal: 'SIGINT' | 'SIGTERM', code: number): void {
  process.once(signal, () => {
    // Output files are written through a temporary file (src/cli/output-file.ts). A whole-text write is synchronous,
    // so this handler runs before it began or after it ended; a streamed one (the samples CSV) pauses between chunks,
    // so this handler may run mid-file: either way every temporary file still being written is removed here. Exiting
    // ends the Monte Carlo worker threads with the process.
    removePendingTemporaries();
    process.stderr.write(`\ntrimfree: interrupted (${signal}); stopped, no output file left half-written\n`);
    process.exit(code);
  });
}

onSignal('SIGINT', 128 + 2); // EXIT_INTERRUPTED in run.ts
onSignal('SIGTERM', 128 + 15);

process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  process.stderr.write(`trimfree: cannot write to stdout (${String(error.code ?? error.message)})\n`);
  process.exit(1);
});

const { runCli } = await import('./run.js');
const outcome = await runCli(process.argv);
if (outcome.line !== undefined) process.stderr.write(`trimfree: ${outcome.line}\n`);
// Let stdout drain (a large report through a pipe) and end naturally; should anything still hold the process
// (a worker a failed run left behind), exit anyway shortly after.
process.exitCode = outcome.code;
if (outcome.code !== 0) setTimeout(() => process.exit(outcome.code), 1000).unref();
