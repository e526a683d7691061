// Files and runs as a user meets them: a real subprocess of the built CLI sent SIGINT mid-run stops (exit 130, the
// shells' 128 + 2 convention), leaves no temporary or partial output file, and says so in one line; output files are
// never replaced without --force, and with it are replaced whole, through a temporary file that does not linger.
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../src/project-root.js';

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
const CHARGER = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');

interface Ended {
  code: number | null;
  signal: NodeJS.Signals | null;
  stdout: string;
  stderr: string;
}

/** Starts the CLI, sends SIGINT once it has run `afterMs`, and resolves when it ends. */
function interruptAfter(args: string[], cwd: string, afterMs: number): Promise<Ended & { secondsToStop: number }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [MAIN, ...args], { cwd });
    let stdout = '';
    let stderr = '';
    let sentAt = 0;
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    const timer = setTimeout(() => {
      sentAt = performance.now();
      child.kill('SIGINT');
    }, afterMs);
    child.on('close', (code, signal) => {
      clearTimeout(timer);
      done({ code, signal, stdout, stderr, secondsToStop: sentAt === 0 ? -1 : (performance.now() - sentAt) / 1000 });
    });
  });
}

describe('Ctrl-C during a long run (subprocess sent SIGINT)', { timeout: 120_000 }, () => {
  // 1e9 trials take minutes, so each run is certainly mid-way when the signal comes 1.5 s after the start.
  const cases: Array<[string, string[]]> = [
    ['spread on worker threads, writing a report and a CSV', ['spread', CHARGER, '--trials', '1e9', '--report', 'out.html', '--samples', 'out.csv']],
    ['spread on the calling thread (--workers 1)', ['spread', CHARGER, '--trials', '1e9', '--workers', '1', '--report', 'out.html']],
    // 5e8: design runs the spread and then every grade, 5e9 trials in all (1e9 each would pass the 1e10 total).
    ['design (spread, then grades), writing a report', ['design', CHARGER, '--trials', '5e8', '--report', 'out.html']],
    ['grades in its grade search (joint yields on the calling thread)', ['grades', CHARGER, '--trials', '1000', '--search-trials', '10000000']],
  ];
  for (const [name, args] of cases) {
    it(`${name}: exit 130, one line on stderr, nothing on stdout, no file left in the folder`, async () => {
      const dir = mkdtempSync(join(tmpdir(), 'trimfree-int-'));
      const ended = await interruptAfter(args, dir, 1500);
      expect(ended.signal, 'ended by its own handler, not killed by the signal').toBeNull();
      expect(ended.code, ended.stderr).toBe(130);
      expect(ended.stdout).toBe('');
      // Each of these runs takes well over a minute, so it first says how long (src/cli/work-budget.ts).
      expect(ended.stderr.trim()).toMatch(/^note: this run will take about \d+(\.\d)? (min|h) \(estimate: .*trials.*\); Ctrl-C stops it\n+trimfree: interrupted \(SIGINT\); stopped, no output file left half-written$/);
      expect(readdirSync(dir), 'no output, partial or temporary file').toEqual([]);
      // It stops when asked, not after the run: a generous bound for a loaded two-core machine (the runs asked
      // for take minutes).
      expect(ended.secondsToStop).toBeGreaterThanOrEqual(0);
      expect(ended.secondsToStop).toBeLessThan(15);
    });
  }
});

describe('Ctrl-C while the samples CSV is being streamed to disk (subprocess sent SIGINT)', { timeout: 120_000 }, () => {
  it('the temporary file is removed: exit 130, one line on stderr, no CSV, no temporary file', async () => {
    // 3e6 rows (about 1.5 GB, tens of seconds of writing): the signal is sent once the temporary file holds more
    // than 4 MB, so it certainly comes mid-file, after the run and while rows are being written.
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-int-csv-'));
    const child = spawn(process.execPath, [MAIN, 'spread', CHARGER, '--trials', '3000000', '--samples', 'out.csv', '--sample-rows', '3000000'], { cwd: dir });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    let bytesAtSignal = 0;
    let namesAtSignal: string[] = [];
    let sentAt = 0;
    const poll = setInterval(() => {
      if (sentAt !== 0) return;
      const names = readdirSync(dir);
      const temporary = names.find((n) => /^\.tf-[A-Za-z0-9_-]{6}$/.test(n));
      if (temporary === undefined) return;
      let bytes = 0;
      try {
        bytes = statSync(join(dir, temporary)).size;
      } catch {
        return;
      }
      if (bytes < 4e6) return;
      bytesAtSignal = bytes;
      namesAtSignal = names;
      sentAt = performance.now();
      child.kill('SIGINT');
    }, 20);
    const ended = await new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((done) => child.on('close', (code, signal) => done({ code, signal })));
    clearInterval(poll);
    const secondsToStop = (performance.now() - sentAt) / 1000;
    expect(sentAt, `the temporary file never passed 4 MB; stderr: ${stderr}`).toBeGreaterThan(0);
    expect(namesAtSignal, 'mid-file: only the temporary file, no out.csv yet').toEqual([expect.stringMatching(/^\.tf-[A-Za-z0-9_-]{6}$/)]);
    expect(bytesAtSignal).toBeLessThan(1e9); // far from the whole file (about 1.5 GB)
    expect(ended.signal, 'ended by its own handler, not killed by the signal').toBeNull();
    expect(ended.code, stderr).toBe(130);
    expect(stdout).toBe('');
    expect(stderr.trim()).toMatch(/^trimfree: interrupted \(SIGINT\); stopped, no output file left half-written$/);
    expect(readdirSync(dir), 'no CSV, partial or temporary').toEqual([]);
    // Answered between two chunks (a chunk is a fraction of a second), not at the end of the file; a generous bound
    // for a loaded two-core machine.
    expect(secondsToStop).toBeLessThan(10);
  });
});

describe('output files are never overwritten without --force', { timeout: 120_000 }, () => {
  const writers: Array<[string, (path: string) => string[]]> = [
    ['init --out', (path) => ['init', '--kind', 'charger', '--out', path]],
    ['schema --out', (path) => ['schema', '--out', path]],
    ['spread --report', (path) => ['spread', CHARGER, '--trials', '2000', '--report', path]],
    ['spread --samples', (path) => ['spread', CHARGER, '--trials', '2000', '--samples', path]],
    ['design --report', (path) => ['design', CHARGER, '--trials', '2000', '--no-grades', '--report', path]],
  ];
  for (const [name, argsFor] of writers) {
    it(`${name}: refused (exit 2, names the option and --force), file untouched; with --force replaced whole, no temporary left`, () => {
      const dir = mkdtempSync(join(tmpdir(), 'trimfree-ow-'));
      const path = join(dir, 'existing.out');
      writeFileSync(path, 'the user\'s own file\n');
      const refused = spawnSync(process.execPath, [MAIN, ...argsFor(path)], { encoding: 'utf8' });
      expect(refused.status).toBe(2);
      expect(refused.stderr).toMatch(/^trimfree: --(out|report|samples): .*already exists and would be overwritten; accepted: a new file name, or --force to replace it\n$/);
      expect(readFileSync(path, 'utf8')).toBe('the user\'s own file\n');

      const forced = spawnSync(process.execPath, [MAIN, ...argsFor(path), '--force'], { encoding: 'utf8' });
      expect(forced.status, forced.stderr).toBe(0);
      const text = readFileSync(path, 'utf8');
      expect(text).not.toBe('the user\'s own file\n');
      expect(text.length).toBeGreaterThan(100);
      expect(readdirSync(dir)).toEqual(['existing.out']);
    });
  }
});

describe('Ctrl-C during the largest accepted searches on the calling thread (subprocess sent SIGINT)', { timeout: 120_000 }, () => {
  // The largest stock list accepted (50 000 CSV lines, about 8 MB): parsed in slices with pauses, then searched;
  // and a 1 MB design file listing 1 000 shunt candidates, on a run of 1e9 trials. Before the caps, a million-line
  // list held Ctrl-C for 12.9 s and a 100 000-candidate design for 26.8 s. The signal comes at several moments; each
  // run ends by its own handler (exit 130), or had already finished (exit 0) when it came late.
  const dir = mkdtempSync(join(tmpdir(), 'trimfree-int-search-'));
  const csv = ['qty,value,mpn'];
  for (let i = 0; i < 49_999; i++) csv.push(`${i % 500},${(10 * 10 ** ((6 * i) / 49_999)).toPrecision(6)},MPN-${String(i).padStart(8, '0')}-${'y'.repeat(120)}`);
  writeFileSync(join(dir, 'stock.csv'), `${csv.join('\n')}\n`);
  const design = JSON.parse(readFileSync(CHARGER, 'utf8')) as { notes: unknown; current: { shunt: Record<string, unknown> } };
  design.current.shunt.candidates = Array.from({ length: 1000 }, (_, i) => `${(20 + i * 0.09).toPrecision(6)}m`);
  design.notes = Array.from({ length: 200_000 }, () => 'x');
  writeFileSync(join(dir, 'big.json'), JSON.stringify(design));
  const cases: Array<[string, string[], number]> = [
    ['nearest --stock (50 000 lines) --count 50', ['nearest', '4k7', '--stock', 'stock.csv', '--count', '50'], 700],
    ['spread of a 1 MB design with 1 000 shunt candidates', ['spread', 'big.json', '--trials', '1e9'], 900],
  ];
  for (const [name, args, afterMs] of cases) {
    it(`${name}: ends by its handler within a few seconds`, async () => {
      const ended = await interruptAfter(args, dir, afterMs);
      expect(ended.signal, 'ended by its own handler, not killed by the signal').toBeNull();
      expect([0, 130], ended.stderr).toContain(ended.code);
      if (ended.code === 130) expect(ended.stderr).toMatch(/trimfree: interrupted \(SIGINT\); stopped, no output file left half-written\n$/);
      // A generous bound for a loaded two-core machine (idle, these answer within about 0.5 s: see the commit).
      expect(ended.secondsToStop).toBeLessThan(5);
    });
  }
});
