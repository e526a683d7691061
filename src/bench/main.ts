// `npm run bench`: trials per second, CPU time per trial and peak memory of the full analysis (worst case, RSS, Monte
// Carlo with every statistic) of the CV/CC benchmark design, at 1e6 and 1e7 trials, on one worker and on every core;
// then the start-up case (src/bench/startup.ts). Each case runs in its own child process so its peak resident memory
// is its own.
//   npm run bench                 tables
//   npm run bench -- --json       one JSON document: {monteCarlo: [{trials, workers, seconds, trialsPerSecond,
//                                 cpuNsPerTrial, peakRssMB, …}], startup: {rounds, measure, cases: [{name, cpuMs, ratio, …}]}}
//   npm run bench -- --trials 1e8 only that trial count (one worker and every core)
//   npm run bench -- --kernel wasm only that Monte Carlo kernel (default: the WebAssembly kernel and the JavaScript
//                                 reference side by side, each case once per kernel)
//   npm run bench -- --startup    only the start-up case (--rounds N, default 10)
//   npm run bench -- --grades     `grades` on the LED example (9 resistors × 10 grades) against one `spread` at the same
//                                 trials, alternating rounds (--rounds N, default 3) (src/bench/grades-case.ts)
//   npm run bench -- --peers      the bench case beside its plain C and NumPy peers (src/bench/peers.ts), 1e7 trials
//                                 (--trials N), 3 alternating rounds (--rounds N), trimfree (wasm and js kernels) and C
//                                 on --threads N (default 1)
// Figures depend on the machine and on what else it runs; they are measurements, not tests.
import { execFileSync } from 'node:child_process';
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { analyze } from '../analysis/analyze.js';
import type { KernelName } from '../analysis/kernel/kernel-choices.js';
import { BENCH_SUPPLY } from './cvcc-spec.js';
import { gradesBenchTable, runGradesBench } from './grades-case.js';
import { runPeers, trimfreePeerCase } from './peers.js';
import { runStartup, startupTable } from './startup.js';

interface BenchCase {
  trials: number;
  workers: number;
  /** 'random ambient': each trial judged at the ambient drawn with it (the case kept comparable across versions);
   *  'per unit': each trial also evaluated at every ambient of the model's grid (the default analysis). */
  mode: BenchMode;
  /** The Monte Carlo kernel that ran (src/analysis/kernel/choice.ts). */
  kernel: KernelName;
  /** Model evaluations per trial: 1, or 1 + the grid's ambients. */
  evaluationsPerTrial: number;
  seconds: number;
  trialsPerSecond: number;
  peakRssMB: number;
  /** CPU time of the process (all threads), s: compare with seconds × workers to see contention. */
  cpuSeconds: number;
  /** cpuSeconds per trial, ns (the whole analysis, all threads, worker start-up included). */
  cpuNsPerTrial: number;
  /** One-minute load average when the case started: other jobs on the machine slow every figure. */
  loadAverage: number;
}

type BenchMode = 'random ambient' | 'per unit';

async function runOne(trials: number, workers: number, mode: BenchMode, kernel: KernelName): Promise<BenchCase> {
  const loadAverage = round(loadavg()[0]!, 2);
  const cpuStart = process.cpuUsage();
  const start = process.hrtime.bigint();
  const result = await analyze(BENCH_SUPPLY, { trials, seed: 'bench', workers, perUnit: mode === 'per unit', kernel });
  if (!result.notes.some((n) => n.startsWith(`Kernel: ${kernel} `))) throw new Error(`the run did not use the ${kernel} kernel`);
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  const cpu = process.cpuUsage(cpuStart);
  if (result.trials !== trials) throw new Error(`ran ${result.trials} trials, expected ${trials}`);
  // maxRSS is in kilobytes and covers the worker threads too (they share the process).
  const peakRssMB = process.resourceUsage().maxRSS / 1024;
  const cpuSeconds = (cpu.user + cpu.system) / 1e6;
  return {
    trials,
    workers: result.workers,
    mode,
    kernel,
    evaluationsPerTrial: 1 + (result.ambientGridC?.length ?? 0),
    seconds: round(seconds, 3),
    trialsPerSecond: Math.round(trials / seconds),
    peakRssMB: round(peakRssMB, 1),
    cpuSeconds: round(cpuSeconds, 3),
    cpuNsPerTrial: round((cpuSeconds * 1e9) / trials, 1),
    loadAverage,
  };
}

function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

function argValue(args: string[], name: string): string | undefined {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const one = argValue(args, '--case');
  if (one) {
    const [trials, workers, perUnit, kernel] = one.split(',');
    process.stdout.write(`${JSON.stringify(await runOne(Number(trials), Number(workers), perUnit === '1' ? 'per unit' : 'random ambient', kernel === 'js' ? 'js' : 'wasm'))}\n`);
    return;
  }
  const peerCase = argValue(args, '--peer-case');
  if (peerCase) {
    const [trials, workers, kernel] = peerCase.split(',');
    process.stdout.write(`${JSON.stringify(await trimfreePeerCase(Number(trials), Number(workers ?? 1), kernel === 'js' ? 'js' : 'wasm'))}\n`);
    return;
  }
  const peers = args.includes('--peers');
  const roundsText = argValue(args, '--rounds') ?? (peers ? '3' : '10');
  const rounds = Number(roundsText);
  if (!Number.isInteger(rounds) || rounds < 1) {
    process.stderr.write(`--rounds: ${roundsText} is not a whole number of rounds; accepted: e.g. 10\n`);
    process.exitCode = 2;
    return;
  }
  if (peers) {
    const trialsText = argValue(args, '--trials') ?? '1e7';
    const trials = Number(trialsText);
    if (!Number.isInteger(trials) || trials < 1) {
      process.stderr.write(`--trials: ${trialsText} is not a whole number of trials; accepted: e.g. 1e7\n`);
      process.exitCode = 2;
      return;
    }
    const threadsText = argValue(args, '--threads') ?? '1';
    const threads = Number(threadsText);
    if (!Number.isInteger(threads) || threads < 1 || threads > 64) {
      process.stderr.write(`--threads: ${threadsText} is not a usable thread count; accepted: a whole number from 1 to 64\n`);
      process.exitCode = 2;
      return;
    }
    await runPeers(trials, rounds, threads, (text) => process.stdout.write(text));
    return;
  }
  if (args.includes('--grades')) {
    const result = runGradesBench(argValue(args, '--rounds') ? rounds : 3);
    process.stdout.write(args.includes('--json') ? `${JSON.stringify({ grades: result })}\n` : gradesBenchTable(result));
    return;
  }
  if (args.includes('--startup')) {
    const startup = runStartup(rounds);
    process.stdout.write(args.includes('--json') ? `${JSON.stringify({ startup })}\n` : startupTable(startup));
    return;
  }
  const custom = argValue(args, '--trials');
  const trialCounts = custom ? [Number(custom)] : [1e6, 1e7];
  if (trialCounts.some((t) => !Number.isInteger(t) || t < 1)) {
    process.stderr.write(`--trials: ${custom} is not a whole number of trials; accepted: e.g. 1e6\n`);
    process.exitCode = 2;
    return;
  }
  const kernelText = argValue(args, '--kernel');
  if (kernelText !== undefined && kernelText !== 'wasm' && kernelText !== 'js') {
    process.stderr.write(`--kernel: ${kernelText} is not a kernel; accepted: wasm or js\n`);
    process.exitCode = 2;
    return;
  }
  const kernels: KernelName[] = kernelText === undefined ? ['wasm', 'js'] : [kernelText];
  const cores = availableParallelism();
  const workerCounts = cores > 1 ? [1, cores] : [1];
  const cases: BenchCase[] = [];
  const self = fileURLToPath(import.meta.url);
  // Random ambient first (the case kept as it was, comparable across versions), then the per-unit evaluation.
  for (const perUnit of [0, 1]) {
    for (const trials of trialCounts) {
      for (const workers of workerCounts) {
        for (const kernel of kernels) {
          const out = execFileSync(process.execPath, [self, '--case', `${trials},${workers},${perUnit},${kernel}`], { encoding: 'utf8', maxBuffer: 1 << 20 });
          cases.push(JSON.parse(out.trim()) as BenchCase);
        }
      }
    }
  }
  const startup = runStartup(rounds);
  const grades = runGradesBench(3);
  if (args.includes('--json')) {
    process.stdout.write(`${JSON.stringify({ monteCarlo: cases, startup, grades })}\n`);
    return;
  }
  process.stdout.write('CV/CC benchmark design (divider + noninv current limit, 16 uncertain quantities), full analysis\n');
  process.stdout.write('mode             kernel  evals/trial  trials      workers  seconds  trials/s      peak RSS  CPU s   CPU ns/trial  load avg\n');
  for (const c of cases) {
    process.stdout.write(
      `${c.mode.padEnd(17)}${c.kernel.padEnd(8)}${String(c.evaluationsPerTrial).padEnd(13)}${c.trials.toExponential(0).padEnd(12)}${String(c.workers).padEnd(9)}${c.seconds.toFixed(2).padEnd(9)}${c.trialsPerSecond.toExponential(2).padEnd(14)}${`${c.peakRssMB.toFixed(0)} MB`.padEnd(10)}${c.cpuSeconds.toFixed(2).padEnd(8)}${c.cpuNsPerTrial.toFixed(0).padEnd(14)}${c.loadAverage.toFixed(2)}\n`,
    );
  }
  process.stdout.write(`\n${startupTable(startup)}`);
  process.stdout.write(`\n${gradesBenchTable(grades)}`);
}

await main();
