// `trimfree schema`: prints the design file's JSON Schema (draft 2020-12), for editors to complete and check files.
import { Command } from 'commander';
import { designJsonSchema } from '../design/json-schema.js';
import { writeOutputFile } from './output-file.js';

interface SchemaOptions {
  out?: string;
  force?: boolean;
  json?: boolean;
}

function run(options: SchemaOptions): void {
  const text = `${JSON.stringify(designJsonSchema(), null, 2)}\n`;
  if (options.out === undefined || options.out === '-') {
    process.stdout.write(text);
    return;
  }
  writeOutputFile(options.out, text, { force: options.force ?? false, where: '--out' });
  if (options.json) process.stdout.write(`${JSON.stringify({ file: options.out })}\n`);
  else process.stderr.write(`wrote ${options.out}\n`);
}

export function schemaCommand(): Command {
  return new Command('schema')
    .description("print the design file's JSON Schema (for editors)")
    .configureOutput({ outputError: () => undefined })
    .option('--out <file>', 'file to write (default, or -: print to stdout)')
    .option('--force', 'overwrite an existing --out file', false)
    .option('--json', 'the schema is JSON already; with --out, print { file }')
    .addHelpText(
      'after',
      `
The schema covers fields, types and choices; cross-field rules (a window that holds its target, fields that
depend on the topology) are checked when trimfree loads the file.

Examples:
  $ trimfree schema --out design.schema.json
  then add  "$schema": "./design.schema.json"  to a design file so the editor checks it as you type.`,
    )
    .action((options: SchemaOptions) => run(options));
}
