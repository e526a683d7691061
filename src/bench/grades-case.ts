// `npm run bench -- --grades`: the grade study against one spread of the same design at the same trials, in one
// run: `grades` on the LED example (examples/led-driver-highside.json, 9 resistors) with all ten grades allowed, and
// `spread` on the same file, each a fresh process, in alternating rounds (so a load that comes and goes on the
// machine falls on both alike). The goal it measures (issue 14, section 3): grades under 3× the time of the spread.
// Wall time is the median per command; CPU time (user + system, all threads) the mean, from the kernel's account of
// waited-for children (startup.ts). Also printed: the search's own model evaluations and seconds from grades --json.
// A measurement, never a test.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { PROJECT_ROOT } from '../project-root.js';
import { childTicks, clockTicksPerSecond } from './startup.js';

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
const DESIGN = join('examples', 'led-driver-highside.json');
const ALL_GRADES = '10%,5%,2%,1%,0.5%,0.25%,0.1%,0.05%,0.02%,0.01%';

export interface GradesBenchCommand {
  name: string;
  /** Median wall time per run, s. */
  wallSeconds: number;
  /** Mean CPU time per run (user + system, all threads), s; null where /proc is missing. */
  cpuSeconds: number | null;
}

export interface GradesBenchResult {
  design: string;
  trials: number;
  rounds: number;
  spread: GradesBenchCommand;
  grades: GradesBenchCommand;
  /** grades over spread, wall (medians) and CPU (means). The goal: under 3. */
  wallRatio: number;
  cpuRatio: number | null;
  /** From the last grades --json: the search's method block and the cheapest mix found. */
  search: { evaluations: number; seconds: number; assignments: number; screened: number; studySeconds: number; found: boolean; cost: number | null };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

const round = (value: number, decimals: number): number => Math.round(value * 10 ** decimals) / 10 ** decimals;

export function runGradesBench(rounds: number, trials = 200_000): GradesBenchResult {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: build first (npx tsc -p ${PROJECT_ROOT})`);
  const cpu = existsSync('/proc/self/stat');
  const ticks = cpu ? clockTicksPerSecond() : 0;
  const commands = [
    { name: `spread ${DESIGN} --trials ${trials}`, args: [MAIN, 'spread', DESIGN, '--trials', String(trials), '--json'] },
    { name: `grades ${DESIGN} --trials ${trials} --grades (all ten)`, args: [MAIN, 'grades', DESIGN, '--trials', String(trials), '--grades', ALL_GRADES, '--json'] },
  ];
  const walls: number[][] = commands.map(() => []);
  const cpuTicks = commands.map(() => 0);
  let lastGrades = '';
  for (let r = 0; r < rounds; r++) {
    commands.forEach((c, i) => {
      const before = cpu ? childTicks() : 0;
      const start = process.hrtime.bigint();
      const run = spawnSync(process.execPath, c.args, { cwd: PROJECT_ROOT, encoding: 'utf8', maxBuffer: 64 << 20 });
      walls[i]!.push(Number(process.hrtime.bigint() - start) / 1e9);
      if (run.status !== 0) throw new Error(`${c.name} exited ${String(run.status)}: ${run.stderr.trim()}`);
      if (cpu) cpuTicks[i]! += childTicks() - before;
      if (i === 1) lastGrades = run.stdout;
    });
  }
  const summary = commands.map((c, i): GradesBenchCommand => ({
    name: c.name,
    wallSeconds: round(median(walls[i]!), 3),
    cpuSeconds: cpu ? round(cpuTicks[i]! / ticks / rounds, 3) : null,
  }));
  const json = JSON.parse(lastGrades) as { method: GradesBenchResult['search']; cheapest: { found: boolean; cost: number | null } };
  const [spread, grades] = summary as [GradesBenchCommand, GradesBenchCommand];
  return {
    design: DESIGN,
    trials,
    rounds,
    spread,
    grades,
    wallRatio: round(grades.wallSeconds / spread.wallSeconds, 2),
    cpuRatio: spread.cpuSeconds && grades.cpuSeconds ? round(grades.cpuSeconds / spread.cpuSeconds, 2) : null,
    search: {
      evaluations: json.method.evaluations,
      seconds: round(json.method.seconds, 3),
      assignments: json.method.assignments,
      screened: json.method.screened,
      studySeconds: round(json.method.studySeconds, 3),
      found: json.cheapest.found,
      cost: json.cheapest.cost,
    },
  };
}

export function gradesBenchTable(result: GradesBenchResult): string {
  const lines = [
    `grade study against one spread, ${result.design}, ${result.trials} trials, ${result.rounds} alternating rounds (goal: grades under 3× spread)`,
    `${'command'.padEnd(72)}${'wall s'.padStart(9)}${'CPU s'.padStart(9)}`,
    ...[result.spread, result.grades].map((c) => `${c.name.padEnd(72)}${c.wallSeconds.toFixed(2).padStart(9)}${(c.cpuSeconds === null ? '–' : c.cpuSeconds.toFixed(2)).padStart(9)}`),
    `grades / spread: wall ${result.wallRatio.toFixed(2)}×, CPU ${result.cpuRatio === null ? '–' : `${result.cpuRatio.toFixed(2)}×`}`,
    `search: ${result.search.evaluations.toExponential(3)} model evaluations in ${result.search.seconds.toFixed(2)} s (${result.search.assignments} assignments evaluated, ${result.search.screened} screened); whole study ${result.search.studySeconds.toFixed(2)} s; ${result.search.found ? `cheapest mix costs ${Number((result.search.cost ?? 0).toPrecision(6))}` : 'no mix found'}`,
  ];
  return `${lines.join('\n')}\n`;
}
