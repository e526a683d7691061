// `npm run bench -- --peers`: trimfree's bench case beside two peers of our own that run the same model with the same
// statistics (src/bench/peers/): a plain C program (built here with gcc) and a vectorised NumPy program. Each runner
// is skipped, with the reason printed, when its tool is missing; this is a measurement, never a test, and CI needs
// neither gcc nor python. The runners take turns in each round (trimfree, C, NumPy, then again), so a load that comes
// and goes on the machine falls on all of them alike; each figure is the median over the rounds.
//
// Every runner times its own computation with its process's CPU clock (all threads) and a wall clock, after start-up
// and input (trimfree: the whole analysis, worst case, RSS and Monte Carlo, as the bench case; the peers: worst case
// and Monte Carlo; RSS is 32 model evaluations, nothing beside 1e7 trials). One thread each by default; --threads N
// runs trimfree (workers N) and the C peer on N threads, NumPy stays on one. The peers read the part bands from
// the engine's own Model of the bench design, so all three run the same parts; their random streams differ, so their
// figures agree within Monte Carlo error, which the table checks.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyze } from '../analysis/analyze.js';
import type { KernelName } from '../analysis/kernel/kernel-choices.js';
import { buildSupplyModel } from '../analysis/models/supply.js';
import { PROJECT_ROOT } from '../project-root.js';
import { partHigh, partLow } from '../tolerance/part.js';
import { BENCH_SUPPLY } from './cvcc-spec.js';

/** The bench Model's parts in the order the peers wire them (supply-peer.c and supply_peer.py name the same). */
const PEER_PART_ORDER = ['T ambient', 'Vref', 'Vref tempco', 'R1', 'R1 TCR', 'R2', 'R2 TCR', 'Ifb', 'RS', 'RS TCR', 'Vth', 'Vos cmp', 'Vos amp', 'Ib amp', 'RF', 'RG'];
const PEER_OUTPUTS = ['vout', 'dividerCurrent', 'ilimit', 'shuntLoss', 'ampOutput'] as const;
/** Outputs compared across runners: mean and σ within Monte Carlo error. */
const COMPARED = ['vout', 'ilimit', 'shuntLoss'] as const;
const BINS = 8192;
const CHUNK = 65536;

interface OutputFigures {
  mean: number;
  sigma: number;
  yieldPct?: number;
}

interface RunnerResult {
  runner: string;
  cpuSeconds: number;
  wallSeconds: number;
  outputs: Record<string, OutputFigures>;
}

/** The peers' input: trials, seed, bins, chunk, θ; the spec windows; one line per part "kind lo hi k". */
export function peerInput(trials: number, seed: number): string {
  const model = buildSupplyModel(BENCH_SUPPLY);
  const names = model.parts.map((p) => p.name);
  if (names.join('|') !== PEER_PART_ORDER.join('|')) {
    throw new Error(`the bench design's parts (${names.join(', ')}) are no longer those the peers wire (${PEER_PART_ORDER.join(', ')}): update src/bench/peers/`);
  }
  const outputNames = model.outputs.map((o) => o.name);
  if (outputNames.join('|') !== PEER_OUTPUTS.join('|')) throw new Error(`the bench design's outputs (${outputNames.join(', ')}) differ from the peers'`);
  const window = (name: string): [number, number] => model.outputs.find((o) => o.name === name)!.spec ?? [-Infinity, Infinity];
  const windows = ['vout', 'ilimit', 'shuntLoss', 'ampOutput'].flatMap(window);
  const theta = BENCH_SUPPLY.sense?.shunt.thermalResistanceKPerW ?? 0;
  const parts = model.parts.map((p) => {
    const d = p.distribution;
    const kind = d.kind === 'uniform' ? 0 : d.kind === 'normal' ? 1 : d.kind === 'truncated-normal' ? 2 : -1;
    if (kind < 0) throw new Error(`part ${p.name}: the peers draw uniform, normal and truncated-normal parts only, not ${d.kind}`);
    const k = 'k' in d && d.k !== undefined ? d.k : 3;
    return `${kind} ${partLow(p)} ${partHigh(p)} ${k}`;
  });
  return [`${trials} ${seed} ${BINS} ${CHUNK} ${theta}`, windows.join(' '), ...parts, ''].join('\n');
}

/**
 * trimfree's side, run in a child process: the bench analysis on `workers` threads and the named kernel, timed, with
 * its figures. Units are judged at the ambient drawn with them (the bench's random-ambient case), as the peers do:
 * one model evaluation per trial for every runner.
 */
export async function trimfreePeerCase(trials: number, workers: number, kernel: KernelName): Promise<RunnerResult> {
  const cpuStart = process.cpuUsage();
  const start = process.hrtime.bigint();
  const result = await analyze(BENCH_SUPPLY, { trials, seed: 'bench', workers, perUnit: false, kernel });
  const wallSeconds = Number(process.hrtime.bigint() - start) / 1e9;
  const cpu = process.cpuUsage(cpuStart);
  const outputs: Record<string, OutputFigures> = {};
  for (const [name, o] of Object.entries(result.outputs)) {
    outputs[name] = { mean: o.mean, sigma: o.sigma, ...(o.yield ? { yieldPct: o.yield.pct } : {}) };
  }
  return { runner: 'trimfree', cpuSeconds: (cpu.user + cpu.system) / 1e6, wallSeconds, outputs };
}

interface Runner {
  name: string;
  run: (round: number) => RunnerResult;
}

/**
 * The NumPy peer's environment: its numerical libraries held to one thread, so the peer is the one-thread runner its
 * label says. Left to themselves, OpenBLAS's threads ran beside it and its CPU time was 1.9× (quiet machine) to 4×
 * (busy machine) its one-thread figure (measured: 11.3 s against 2.83 s of CPU time for 1e7 trials with the machine
 * busy), which made trimfree look faster than it is against NumPy.
 */
const ONE_THREAD_ENV: NodeJS.ProcessEnv = { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };

function toolVersion(command: string, args: string[]): string | null {
  const r = spawnSync(command, args, { encoding: 'utf8' });
  return r.status === 0 ? `${r.stdout}${r.stderr}`.trim().split('\n')[0]! : null;
}

function runJson(command: string, args: string[], input: string, env: NodeJS.ProcessEnv = process.env): RunnerResult {
  const r = spawnSync(command, args, { input, encoding: 'utf8', maxBuffer: 1 << 20, env });
  if (r.status !== 0) throw new Error(`${command} ${args.join(' ')} exited ${String(r.status)}: ${r.stderr.trim()}`);
  return JSON.parse(r.stdout) as RunnerResult;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** Runs the comparison; `threads` > 1 runs trimfree and the C peer on that many threads (NumPy stays on one). */
export async function runPeers(trials: number, rounds: number, threads: number, write: (text: string) => void): Promise<void> {
  const self = join(PROJECT_ROOT, 'dist', 'src', 'bench', 'main.js');
  const peersDir = join(PROJECT_ROOT, 'src', 'bench', 'peers');
  const runners: Runner[] = (['wasm', 'js'] as const).map((kernel) => ({
    name: `trimfree, ${kernel} kernel (${threads === 1 ? '1 thread' : `${threads} threads`})`,
    run: () => JSON.parse(execFileSync(process.execPath, [self, '--peer-case', `${trials},${threads},${kernel}`], { encoding: 'utf8', maxBuffer: 1 << 20 }).trim()) as RunnerResult,
  }));
  const skipped: string[] = [];
  const work = mkdtempSync(join(tmpdir(), 'trimfree-peers-'));
  try {
    const gcc = toolVersion('gcc', ['-dumpfullversion']);
    if (gcc === null) skipped.push('plain C peer: no gcc on this machine');
    else {
      const binary = join(work, 'supply-peer');
      const build = spawnSync('gcc', ['-O2', '-pthread', '-o', binary, join(peersDir, 'supply-peer.c'), '-lm'], { encoding: 'utf8' });
      if (build.status !== 0) skipped.push(`plain C peer: gcc could not build it (${build.stderr.trim().split('\n')[0] ?? ''})`);
      else runners.push({ name: `plain C (gcc ${gcc} -O2, ${threads === 1 ? '1 thread' : `${threads} threads`})`, run: (round) => runJson(binary, [String(threads)], peerInput(trials, round + 1)) });
    }
    const numpy = toolVersion('python3', ['-c', 'import numpy, sys; print("numpy", numpy.__version__, "python", sys.version.split()[0])']);
    if (numpy === null) skipped.push('NumPy peer: no python3 with numpy on this machine');
    else runners.push({ name: `vectorised NumPy (${numpy}, 1 thread)`, run: (round) => runJson('python3', [join(peersDir, 'supply_peer.py')], peerInput(trials, round + 1), ONE_THREAD_ENV) });

    write(`peers: the bench model (examples/engine/bench-supply.json, 16 uncertain parts, 5 outputs, ${BINS}-bin histograms, worst case over every vertex), ${trials.toExponential(0)} trials, ${rounds} alternating rounds; CPU time is all threads' together, wall time from the runner's own clock around the same work\n`);
    for (const reason of skipped) write(`skipped: ${reason}\n`);
    if (trials * PEER_OUTPUTS.length * 8 <= 256 * 2 ** 20) {
      write('note: at this trial count trimfree keeps every value and sorts for exact quantiles; the peers read them from the histogram (as trimfree does above 256 MiB of values, e.g. at 1e7 trials)\n');
    }
    const results: RunnerResult[][] = runners.map(() => []);
    for (let r = 0; r < rounds; r++) runners.forEach((runner, i) => results[i]!.push(runner.run(r)));

    const nsPerTrial = results.map((rs) => median(rs.map((x) => (x.cpuSeconds * 1e9) / trials)));
    const wallNsPerTrial = results.map((rs) => median(rs.map((x) => (x.wallSeconds * 1e9) / trials)));
    const base = nsPerTrial[0]!;
    write(`${'runner (median of the rounds)'.padEnd(66)}${'CPU ns/trial'.padStart(13)}${'÷ trimfree wasm'.padStart(17)}${'wall ns/trial'.padStart(15)}\n`);
    runners.forEach((runner, i) => {
      const ratio = nsPerTrial[i]! / base;
      const speed = i === 0 ? '' : ratio < 1 ? `trimfree uses ${(1 / ratio).toFixed(1)}× its CPU time` : `uses ${ratio.toFixed(1)}× trimfree's CPU time`;
      write(`${runner.name.slice(0, 65).padEnd(66)}${nsPerTrial[i]!.toFixed(0).padStart(13)}${ratio.toFixed(2).padStart(17)}${wallNsPerTrial[i]!.toFixed(0).padStart(15)}  ${speed}\n`);
    });
    // Agreement: each runner's last round against trimfree's; two independent means differ by σ·√(2/N) in standard
    // error (JCGM 101:2008 7.6: the standard error of a Monte Carlo mean is σ/√N). σ itself: its standard error is about
    // σ/√(2N) for a near-normal output (from memory), so two σ differ by about σ/√N.
    const reference = results[0]!.at(-1)!;
    runners.forEach((runner, i) => {
      if (i === 0) return;
      const other = results[i]!.at(-1)!;
      const worst = COMPARED.map((name) => {
        const a = reference.outputs[name]!;
        const b = other.outputs[name]!;
        const meanSe = a.sigma * Math.sqrt(2 / trials);
        const sigmaSe = a.sigma / Math.sqrt(trials);
        return Math.max(Math.abs(b.mean - a.mean) / meanSe, Math.abs(b.sigma - a.sigma) / sigmaSe);
      });
      const largest = Math.max(...worst);
      write(`${runner.name.split(' (')[0]}: mean and σ of ${COMPARED.join(', ')} differ from trimfree's by at most ${largest.toFixed(1)} standard errors ${largest <= 4 ? '(agree)' : '(MORE THAN 4: check the peer)'}\n`);
    });
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
