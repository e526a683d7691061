// Builds the top-level `trimfree` program. Every command in the table (commands.ts) is listed; only the one the
// command line names is loaded in full, so `--version`, `--help` and each command start without the others' modules
// (the design-file schema, the Monte Carlo engine, the report renderers).
import { Command, Help } from 'commander';
import { COMMANDS, commandInvoked } from './commands.js';
import { VERSION } from './version.js';

const defaultHelp = new Help();

function termOf(command: Command): string {
  const entry = COMMANDS.find((c) => c.name === command.name());
  return entry ? `${entry.name} ${entry.terms}`.trimEnd() : defaultHelp.subcommandTerm(command);
}

/** The program with the commands given in full and every other command as its name and description only. */
export function buildProgram(loaded: readonly Command[] = []): Command {
  const program = new Command('trimfree')
    .description('standard values, current-sense parts and production spread for CV/CC DC-DC supplies')
    .version(VERSION, '-V, --version', 'print the version')
    .showHelpAfterError(false)
    .configureOutput({ outputError: () => undefined })
    // The command list shows each command as the table has it, loaded in full or not (the same line either way);
    // commander's own `help [command]` keeps its default line.
    .configureHelp({ subcommandTerm: termOf });
  for (const entry of COMMANDS) {
    program.addCommand(loaded.find((c) => c.name() === entry.name) ?? new Command(entry.name).description(entry.description));
  }
  program.exitOverride();
  // Subcommands do not inherit the silenced error output: main.ts prints the one line itself.
  for (const command of program.commands) {
    command.exitOverride();
    command.configureOutput({ outputError: () => undefined });
  }
  return program;
}

/** The program for this command line: the command it names (if any) loaded in full. */
export async function programFor(argv: readonly string[]): Promise<Command> {
  const entry = commandInvoked(argv);
  return buildProgram(entry ? [await entry.load()] : []);
}
