// Builds the top-level `trimfree` program from the registered subcommands.
import { Command } from 'commander';
import { commandFactories } from './commands.js';
import { VERSION } from './version.js';

export function buildProgram(): Command {
  const program = new Command('trimfree')
    .description('standard values, current-sense parts and production spread for CV/CC DC-DC supplies')
    .version(VERSION, '-V, --version', 'print the version')
    .showHelpAfterError(false)
    .configureOutput({ outputError: () => undefined });
  for (const make of commandFactories) program.addCommand(make());
  program.exitOverride();
  // Subcommands do not inherit the silenced error output: main.ts prints the one line itself.
  for (const command of program.commands) {
    command.exitOverride();
    command.configureOutput({ outputError: () => undefined });
  }
  return program;
}
