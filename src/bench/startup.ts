// `npm run bench -- --startup`: the CPU time of what users wait for at the prompt, beside bare `node -e 0`, in one
// run. Each case is a fresh process; the cases run in alternating rounds (every case once per round), so a load that
// comes and goes on the machine falls on all of them alike.
//
// CPU time is the child's user + system time (all its threads), read from the kernel's account of waited-for
// children: fields cutime and cstime of /proc/self/stat, in clock ticks (proc(5)). A tick is 10 ms on Linux
// (USER_HZ = 100, `getconf CLK_TCK`), coarse for one start-up, so each figure is the mean over the rounds (the
// rounding of single ticks averages out). Where /proc is missing, the figures are wall time and say so.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PROJECT_ROOT } from '../project-root.js';

export interface StartupCase {
  name: string;
  /** Arguments after `node`. */
  args: string[];
  /** Mean CPU time per run (user + system, all threads), ms; wall time where `measure` says so. */
  cpuMs: number;
  /** cpuMs over that of bare `node -e 0` in the same run. */
  ratio: number;
  /** Median wall time per run, ms. */
  wallMs: number;
}

export interface StartupResult {
  rounds: number;
  /** What cpuMs measures on this machine. */
  measure: 'cpu' | 'wall';
  cases: StartupCase[];
}

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');

/** The cases: bare node first (the yardstick), then the quick commands (README's own examples for the picks). */
export const STARTUP_CASES: Array<{ name: string; args: string[] }> = [
  { name: 'node -e 0', args: ['-e', '0'] },
  { name: 'trimfree --version', args: [MAIN, '--version'] },
  { name: 'trimfree --help', args: [MAIN, '--help'] },
  { name: 'trimfree divider --vref 1.25 --vout 12', args: [MAIN, 'divider', '--vref', '1.25', '--vout', '12'] },
  { name: 'trimfree sense --limit 3A --threshold 1V --shunts 20m,33m,50m --vos 0.5mV', args: [MAIN, 'sense', '--limit', '3A', '--threshold', '1V', '--shunts', '20m,33m,50m', '--vos', '0.5mV'] },
];

const PROC_STAT = '/proc/self/stat';

/** CPU time of this process's waited-for children so far, in clock ticks (cutime + cstime, proc(5)). */
export function childTicks(): number {
  const stat = readFileSync(PROC_STAT, 'utf8');
  // Fields after the command name in parentheses (which may hold spaces): state is field 3, cutime 16, cstime 17.
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return Number(fields[13]) + Number(fields[14]);
}

export function clockTicksPerSecond(): number {
  try {
    const value = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim());
    return Number.isFinite(value) && value > 0 ? value : 100;
  } catch {
    return 100; // USER_HZ on Linux (proc(5))
  }
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

export function runStartup(rounds: number): StartupResult {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: build first (npx tsc -p ${PROJECT_ROOT})`);
  const measure: 'cpu' | 'wall' = existsSync(PROC_STAT) ? 'cpu' : 'wall';
  const ticksPerSecond = measure === 'cpu' ? clockTicksPerSecond() : 0;
  const cpuTicks = STARTUP_CASES.map(() => 0);
  const walls: number[][] = STARTUP_CASES.map(() => []);
  for (let r = 0; r < rounds; r++) {
    STARTUP_CASES.forEach((c, i) => {
      const before = measure === 'cpu' ? childTicks() : 0;
      const start = process.hrtime.bigint();
      const run = spawnSync(process.execPath, c.args, { cwd: PROJECT_ROOT, stdio: ['ignore', 'ignore', 'pipe'], encoding: 'utf8' });
      walls[i]!.push(Number(process.hrtime.bigint() - start) / 1e6);
      if (run.status !== 0) throw new Error(`${c.name} exited ${String(run.status)}: ${run.stderr.trim()}`);
      if (measure === 'cpu') cpuTicks[i]! += childTicks() - before;
    });
  }
  const cpuMs = STARTUP_CASES.map((_, i) => (measure === 'cpu' ? (1000 * cpuTicks[i]!) / ticksPerSecond / rounds : median(walls[i]!)));
  const base = cpuMs[0]!;
  const cases = STARTUP_CASES.map((c, i) => ({
    name: c.name,
    args: c.args.map((a) => (a === MAIN ? 'dist/src/cli/main.js' : a)),
    cpuMs: Math.round(cpuMs[i]! * 10) / 10,
    ratio: base > 0 ? Math.round((cpuMs[i]! / base) * 100) / 100 : 0,
    wallMs: Math.round(median(walls[i]!)),
  }));
  return { rounds, measure, cases };
}

export function startupTable(result: StartupResult): string {
  const cpu = result.measure === 'cpu';
  const what = cpu ? 'CPU ms: user + system, mean per run' : 'no /proc here, so wall ms (median) stands in for CPU time';
  const lines = [
    `start-up: each case a fresh process, ${result.rounds} alternating rounds; ${what}; × node: ratio to bare node in this run`,
    `${'command'.padEnd(78)}${(cpu ? 'CPU ms' : 'wall ms').padStart(8)}${'× node'.padStart(8)}${'wall ms'.padStart(9)}`,
  ];
  for (const c of result.cases) {
    lines.push(`${c.name.padEnd(78)}${c.cpuMs.toFixed(0).padStart(8)}${c.ratio.toFixed(2).padStart(8)}${String(c.wallMs).padStart(9)}`);
  }
  return `${lines.join('\n')}\n`;
}
