// Runs the program on an argv and turns every way a run can end into an exit code and at most one line on stderr:
// 0 done; 1 the --fail-under-yield gate failed (the report is complete) or an internal error (a bug: one line, no
// stack trace); 2 bad input or an impossible request (InputError, ImpossibleError, commander's usage errors).
// main.ts calls it for the real process; tests call it in-process, so the policy is tested without a subprocess.
import { CommanderError } from 'commander';
import { ImpossibleError, InputError, describeError } from '../errors.js';
import { printableText } from '../user-text.js';
import { programFor } from './program.js';
import { EXIT_YIELD_GATE, YieldGateFailure } from './yield-gate-failure.js';

export const EXIT_OK = 0;
export const EXIT_INTERNAL = 1;
export const EXIT_INPUT = 2;
/** 128 + SIGINT (2): the shells' convention for a run stopped by Ctrl-C. */
export const EXIT_INTERRUPTED = 130;

export interface RunOutcome {
  code: number;
  /** The line for stderr (without the "trimfree: " prefix and newline), if any. */
  line?: string;
}

/** Parses and runs `argv` (node, script, args…); never throws. */
export async function runCli(argv: string[]): Promise<RunOutcome> {
  try {
    await (await programFor(argv)).parseAsync(argv);
    return { code: EXIT_OK };
  } catch (error) {
    return outcomeOf(error, argv);
  }
}

/** The exit code and the one line for any error a run can end with. */
export function outcomeOf(error: unknown, argv: string[]): RunOutcome {
  if (error instanceof InputError || error instanceof ImpossibleError) return { code: EXIT_INPUT, line: oneLine(describeError(error)) };
  if (error instanceof YieldGateFailure) return { code: EXIT_YIELD_GATE, line: error.message };
  if (error instanceof CommanderError) {
    // --help and --version end through commander with exit code 0.
    if (error.exitCode === 0) return { code: EXIT_OK };
    const where = error.code === 'commander.unknownCommand' ? '' : commandName(argv);
    return { code: EXIT_INPUT, line: oneLine(`${error.message.replace(/^error: /, '').replace(/\.$/, '')}; see 'trimfree ${where}--help'`) };
  }
  const message = error instanceof Error ? error.message : String(error);
  return { code: EXIT_INTERNAL, line: oneLine(`internal error: ${message} (a bug in trimfree: please report it with the command line and the design file)`) };
}

/** Longest line printed: every message quotes user text cut to 80 characters (src/user-text.ts), so only a bug
 * could make one longer; cut rather than flood the terminal. */
const MAX_LINE = 2000;

/** The message as one line: its own line breaks become spaces, any control character left in user text is shown
 * escaped (so nothing can move the cursor or overwrite the `trimfree:` line), and it is cut to MAX_LINE. */
function oneLine(text: string): string {
  return printableText(text.replace(/\s*\n\s*/g, ' ').trim(), MAX_LINE);
}

function commandName(argv: string[]): string {
  const first = argv.slice(2).find((a) => !a.startsWith('-'));
  return first ? `${first} ` : '';
}
