// The list of subcommands, light enough to load at every start: `trimfree --help` lists every command from this
// table, and a command's own module (with everything it imports) is loaded only when that command runs or shows
// its own help. To register a command, add one line: its name, what the command list shows after the name (as
// commander would print it for the full command), its one-line description, and the import of its factory.
// test/cli-command-table.test.ts checks every line against the command its module builds.
import type { Command } from 'commander';

export interface CommandEntry {
  name: string;
  /** What `trimfree --help` lists after the name: '[options]' when it has options, then its arguments. */
  terms: string;
  /** The one-line description, as the module's own command has it. */
  description: string;
  /** Imports the command's module and builds its commander Command. */
  load: () => Promise<Command>;
}

export const COMMANDS: readonly CommandEntry[] = [
  { name: 'values', terms: '[options] <series>', description: 'list the values of an IEC 60063 E-series within a range, across decades', load: async () => (await import('./values.js')).valuesCommand() },
  { name: 'nearest', terms: '[options] <value>', description: 'standard values below, above and nearest a target resistance, and the best two-part series or parallel pairs', load: async () => (await import('./nearest.js')).nearestCommand() },
  { name: 'divider', terms: '[options]', description: 'feedback-divider resistors for a target output voltage, or fixed resistors around a pot for an adjustable output', load: async () => (await import('./divider.js')).dividerCommand() },
  { name: 'sense', terms: '[options]', description: 'pick shunt, gain resistors and threshold for a current limit; Pareto front of shunt loss against limit spread', load: async () => (await import('./sense.js')).senseCommand() },
  { name: 'spread', terms: '[options] <file>', description: 'worst case, RSS and Monte Carlo spread of a design file: yield, Cpk, contributors, histogram', load: async () => (await import('./spread.js')).spreadCommand() },
  { name: 'grades', terms: '[options] <file>', description: 'tolerance grades side by side; the cheapest per-part grade mix that meets a yield target', load: async () => (await import('./grades.js')).gradesCommand() },
  { name: 'design', terms: '[options] <file>', description: 'fill "auto" values with the pickers, then BOM, spread and grade comparison, and the HTML report', load: async () => (await import('./design.js')).designCommand() },
  { name: 'pilot', terms: '[options] <design.json> <measured.csv>', description: "a pilot build's measured units against the design's prediction: tests, capability, diagnosis, one-resistor re-centring", load: async () => (await import('./pilot.js')).pilotCommand() },
  { name: 'init', terms: '[options]', description: 'write a starter design file with notes explaining each part', load: async () => (await import('./init.js')).initCommand() },
  { name: 'schema', terms: '[options]', description: "print the design file's JSON Schema (for editors)", load: async () => (await import('./schema.js')).schemaCommand() },
];

/**
 * The command an argv (node, script, args…) runs or asks help for: the first argument that is not an option (the
 * top level has only -V and -h, which take no value, so commander dispatches on that word), or the word after
 * `help`. Undefined when there is none or it names no command (commander then reports it).
 */
export function commandInvoked(argv: readonly string[]): CommandEntry | undefined {
  const words = argv.slice(2).filter((a) => !a.startsWith('-'));
  const name = words[0] === 'help' ? words[1] : words[0];
  return COMMANDS.find((c) => c.name === name);
}
