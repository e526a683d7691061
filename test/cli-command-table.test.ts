// The light command table (src/cli/commands.ts) against the commands the modules build: `trimfree --help` lists
// every command from the table without loading the modules, so each line must say what commander itself would print
// for the full command. And the quick paths load only what they need: the modules a real start-up resolves are
// recorded through Node's own module hooks (node:module register, a resolve hook) in a subprocess.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Help } from 'commander';
import { describe, expect, it } from 'vitest';
import { COMMANDS, commandInvoked } from '../src/cli/commands.js';
import { buildProgram } from '../src/cli/program.js';
import { PROJECT_ROOT } from '../src/project-root.js';

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');

describe('the command table matches each command module', () => {
  it('name, description and the help line (commander’s own subcommandTerm of the full command)', async () => {
    const help = new Help();
    for (const entry of COMMANDS) {
      const command = await entry.load();
      expect(command.name()).toBe(entry.name);
      expect(command.description(), entry.name).toBe(entry.description);
      expect(`${entry.name} ${entry.terms}`.trimEnd(), entry.name).toBe(help.subcommandTerm(command));
    }
  });

  it('--help from the table reads exactly as --help with every module loaded', async () => {
    const full = buildProgram(await Promise.all(COMMANDS.map((c) => c.load())));
    const light = buildProgram();
    expect(light.helpInformation()).toBe(full.helpInformation());
    for (const entry of COMMANDS) expect(light.helpInformation()).toContain(entry.name);
  });

  it('the command a command line names: the first word that is not an option, or the word after help', () => {
    const argv = (...args: string[]): string[] => ['node', 'trimfree', ...args];
    expect(commandInvoked(argv('divider', '--vref', '1.25'))?.name).toBe('divider');
    expect(commandInvoked(argv('-h', 'sense'))?.name).toBe('sense');
    expect(commandInvoked(argv('help', 'spread'))?.name).toBe('spread');
    expect(commandInvoked(argv('--version'))).toBeUndefined();
    expect(commandInvoked(argv('help'))).toBeUndefined();
    expect(commandInvoked(argv('frobnicate'))).toBeUndefined();
  });
});

/** The files and packages a run of the built CLI resolves, recorded by a resolve hook. */
function modulesLoaded(args: string[]): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'trimfree-modules-'));
  const log = join(dir, 'resolved.txt');
  const hook = `import { appendFileSync } from 'node:fs';
export async function resolve(specifier, context, next) { const r = await next(specifier, context); appendFileSync(${JSON.stringify(log)}, r.url + '\\n'); return r; }`;
  const register = `import { register } from 'node:module'; register(${JSON.stringify(`data:text/javascript,${encodeURIComponent(hook)}`)});`;
  const run = spawnSync(process.execPath, ['--import', `data:text/javascript,${encodeURIComponent(register)}`, MAIN, ...args], { cwd: PROJECT_ROOT, encoding: 'utf8' });
  try {
    expect(run.status, run.stderr).toBe(0);
    return readFileSync(log, 'utf8').trim().split('\n');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe('start-up loads only what the command needs', { timeout: 60_000 }, () => {
  const commandModule = (url: string): boolean => COMMANDS.some((c) => url.endsWith(`/dist/src/cli/${c.name}.js`));

  it('--version and --help load no command module, no design-file schema (zod) and no engine', () => {
    for (const args of [['--version'], ['--help']]) {
      const loaded = modulesLoaded(args);
      expect(loaded.some((u) => u.endsWith('/dist/src/cli/main.js')), args[0]).toBe(true);
      expect(loaded.filter(commandModule), args[0]).toEqual([]);
      expect(loaded.filter((u) => /\/node_modules\/(zod|seedrandom|cli-table3)\/|\/dist\/src\/(design|analysis)\//.test(u)), args[0]).toEqual([]);
    }
  });

  it('a divider pick loads no command that reads a design, nor zod, the engine or the design layer', () => {
    const loaded = modulesLoaded(['divider', '--vref', '1.25', '--vout', '12']);
    // divider.js shares the table style of values.js, a light module of the same floor.
    expect(loaded.filter(commandModule).map((u) => u.replace(/.*\//, '')).sort()).toEqual(['divider.js', 'values.js']);
    expect(loaded.filter((u) => /\/node_modules\/zod\/|\/dist\/src\/design\/|\/dist\/src\/analysis\/monte-carlo/.test(u))).toEqual([]);
  });

  it('a command that reads a design loads the schema (the hook really sees zod)', () => {
    const loaded = modulesLoaded(['spread', '--help']);
    expect(loaded.some((u) => u.includes('/node_modules/zod/'))).toBe(true);
  });
});
