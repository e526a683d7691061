#!/usr/bin/env node
// Entry point: runs the program, turns every input error into one line on stderr and exit code 2.
import { CommanderError } from 'commander';
import { ImpossibleError, InputError, describeError } from '../errors.js';
import { buildProgram } from './program.js';

export const EXIT_INPUT = 2;

function fail(line: string): never {
  process.stderr.write(`trimfree: ${line}\n`);
  process.exit(EXIT_INPUT);
}

async function main(argv: string[]): Promise<void> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
  } catch (error) {
    if (error instanceof InputError || error instanceof ImpossibleError) fail(describeError(error));
    if (error instanceof CommanderError) {
      if (error.exitCode === 0) process.exit(0);
      fail(`${error.message.replace(/^error: /, '')}; see 'trimfree ${commandName(argv)}--help'`);
    }
    throw error;
  }
}

function commandName(argv: string[]): string {
  const first = argv.slice(2).find((a) => !a.startsWith('-'));
  return first ? `${first} ` : '';
}

main(process.argv).catch((error: unknown) => {
  const message = error instanceof Error ? error.message : String(error);
  process.stderr.write(`trimfree: internal error: ${message}\n`);
  process.exit(1);
});
