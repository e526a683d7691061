// `trimfree init`: writes a starter design file (charger, bench or led) to a file or to stdout.
import { Command, Option } from 'commander';
import { starterText, STARTER_KINDS, type StarterKind } from '../design/templates.js';
import { writeOutputFile } from './output-file.js';

interface InitOptions {
  kind: StarterKind;
  out?: string;
  force?: boolean;
  json?: boolean;
}

function run(options: InitOptions): void {
  const text = starterText(options.kind);
  if (options.out === undefined || options.out === '-') {
    process.stdout.write(options.json ? `${JSON.stringify({ kind: options.kind, file: null, design: JSON.parse(text) })}\n` : text);
    return;
  }
  writeOutputFile(options.out, text, { force: options.force ?? false, where: '--out' });
  if (options.json) process.stdout.write(`${JSON.stringify({ kind: options.kind, file: options.out })}\n`);
  else process.stderr.write(`wrote ${options.out} (a ${options.kind} starter: replace the placeholder figures with your datasheets')\n`);
}

export function initCommand(): Command {
  return new Command('init')
    .description('write a starter design file with notes explaining each part')
    .configureOutput({ outputError: () => undefined })
    .addOption(new Option('--kind <kind>', 'kind of supply').choices([...STARTER_KINDS]).default('bench'))
    .option('--out <file>', 'file to write (default, or -: print to stdout)')
    .option('--force', 'overwrite an existing --out file', false)
    .option('--json', 'print { kind, file } (with --out) or { kind, file: null, design } as JSON')
    .addHelpText(
      'after',
      `
The starter is valid as written and uses "auto" wherever trimfree can pick values; its figures are placeholders.

Examples:
  $ trimfree init --kind charger --out my-charger.json
  $ trimfree init --kind led > led.json
  $ trimfree design my-charger.json`,
    )
    .action((options: InitOptions) => run(options));
}
