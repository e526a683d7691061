#!/usr/bin/env node
// Entry point: runs the program (src/cli/run.ts decides the exit code and the one line on stderr) and handles
// the process's own events: Ctrl-C (SIGINT) and SIGTERM stop the run, remove any output file still being written
// and exit 130 (143); a closed stdout (`trimfree values E192 | head`) ends the run quietly.
// The signal handlers are installed first thing: this module imports nothing statically, so they are in place before
// the program and its commands are loaded (0.1 s idle, much more on a loaded machine), and a Ctrl-C at any moment
// after node itself has started ends the same way.

/** Removes output files still being written; set once output-file.js is loaded (nothing is pending before). */
let removePendingTemporaries = (): void => undefined;

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

({ removePendingTemporaries } = await import('./output-file.js'));
const { runCli } = await import('./run.js');
const outcome = await runCli(process.argv);
if (outcome.line !== undefined) process.stderr.write(`trimfree: ${outcome.line}\n`);
// Let stdout drain (a large report through a pipe) and end naturally; should anything still hold the process
// (a worker a failed run left behind), exit anyway shortly after.
process.exitCode = outcome.code;
if (outcome.code !== 0) setTimeout(() => process.exit(outcome.code), 1000).unref();
