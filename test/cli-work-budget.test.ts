// The work a run will do, decided before it starts (real subprocesses of the built CLI): --workers (or the design
// file's analysis.workers) is capped at the machine's cores with a note, and the numbers do not change; the 1e10
// refusal counts the total work (every grade, the search), and a run of more than about a minute prints its
// estimated time first (and every --json run carries it as workEstimate).
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../src/project-root.js';
import { buildIfMissing, expectOneLineError, runTrimfree } from './cli-subprocess.js';
import { withoutWallTime } from './wall-time.js';

const CHARGER = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');
const cores = availableParallelism();

beforeAll(() => buildIfMissing());


describe('--workers is capped at the cores (was: 256 workers took 5.5 GB and 74 s)', { timeout: 120_000 }, () => {
  it('--workers 256: a note naming the option and the cores, and the same figures as --workers 1', () => {
    const capped = runTrimfree(['spread', CHARGER, '--trials', '20000', '--workers', '256', '--json']);
    expect(capped.status, capped.stderr).toBe(0);
    expect(capped.stderr).toContain(`note: --workers 256 capped at the ${cores} cores of this machine (more threads are no faster and each takes about 25 MB); results do not depend on the count\n`);
    const one = runTrimfree(['spread', CHARGER, '--trials', '20000', '--workers', '1', '--json']);
    expect(one.status).toBe(0);
    expect(one.stderr).not.toContain('capped');
    // Byte-identical, the work estimate included (it is stated for one thread, whatever the count).
    expect(withoutWallTime(capped.stdout)).toBe(withoutWallTime(one.stdout));
  });

  it("the design file's analysis.workers: 256 is capped the same way, the note naming the field", () => {
    const design = JSON.parse(readFileSync(CHARGER, 'utf8')) as { analysis: Record<string, unknown> };
    design.analysis.workers = 256;
    const path = join(mkdtempSync(join(tmpdir(), 'trimfree-wb-')), 'many-workers.json');
    writeFileSync(path, JSON.stringify(design));
    const r = runTrimfree(['spread', path, '--trials', '20000', '--json']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain(`note: analysis.workers 256 capped at the ${cores} cores`);
  });
});

describe('the trial budget counts the whole run', { timeout: 120_000 }, () => {
  it('grades --trials 1e10 is refused: 4 grades + a re-run + the search is about 5e10 trials', () => {
    expectOneLineError(
      runTrimfree(['grades', CHARGER, '--trials', '1e10']),
      /^trimfree: --trials\/--search-trials: this run would evaluate about 5\.0e\+10 trials in all \(4 grades × 10000000000 trials \+ a 10000000000-trial re-run \+ at most 400 search evaluations × 20000 trials and as many in screens\), more than the 1e10 .*refused before any work/,
    );
  });

  it('grades --trials 3e9 (3e9 per grade, 1.5e10 in all) is refused too, though each count alone is accepted', () => {
    expectOneLineError(runTrimfree(['grades', CHARGER, '--trials', '3e9']), /about 1\.5e\+10 trials in all/);
  });

  it('--json carries workEstimate: the trials in all (by hand: 4 × 1000 + 1000 + 2 × 400 × 1000 = 805000) and seconds', () => {
    const r = runTrimfree(['grades', CHARGER, '--trials', '1000', '--search-trials', '1000', '--workers', '1', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const estimate = (JSON.parse(r.stdout) as { workEstimate: { trials: number; estimatedSecondsOnOneThread: number; basis: string } }).workEstimate;
    expect(estimate.trials).toBe(805_000);
    // 805000 trials at 800000 a second on one thread.
    expect(estimate.estimatedSecondsOnOneThread).toBe(Math.round(805_000 / 800_000));
    expect(estimate.basis).toMatch(/measured on the charger example/);
    expect(r.stderr).not.toMatch(/will take about/);
  });

  it('spread --trials auto has no estimate in advance (null), and says why', () => {
    const r = runTrimfree(['spread', CHARGER, '--trials', 'auto', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const estimate = (JSON.parse(r.stdout) as { workEstimate: { trials: null; estimatedSecondsOnOneThread: null; basis: string } }).workEstimate;
    expect(estimate).toMatchObject({ trials: null, estimatedSecondsOnOneThread: null });
    expect(estimate.basis).toMatch(/adaptive run/);
  });
});

describe('--sample-rows above the trial count', { timeout: 60_000 }, () => {
  it('says so in a note (was: clamped silently); the CSV holds every trial', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-wb-'));
    const r = runTrimfree(['spread', CHARGER, '--trials', '2000', '--workers', '1', '--samples', 's.csv', '--sample-rows', '5000'], dir);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain("note: --sample-rows 5000 is more than the run's 2000 trials; the samples CSV holds all 2000\n");
    expect(readFileSync(join(dir, 's.csv'), 'utf8').trimEnd().split('\n')).toHaveLength(2001);
  });
});
