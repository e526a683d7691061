// Output files as a hostile world meets them, through real subprocesses of the built CLI: a full disk (a real small
// tmpfs when the test runs as root and may mount one), a device node as target (even with --force), the same file
// under two spellings, a read-only folder found before the run, a 250-character file name, and `--out -`. Each
// ends in exit 2 with one line naming the option and the operating system's reason, and leaves nothing behind.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeWhole } from '../src/cli/output-file.js';
import { PROJECT_ROOT } from '../src/project-root.js';
import { buildIfMissing, expectOneLineError, runTrimfree } from './cli-subprocess.js';

const CHARGER = join(PROJECT_ROOT, 'examples', 'charger-2s-liion.json');
const QUICK = ['--trials', '2000', '--workers', '1'];
const isRoot = process.getuid?.() === 0;

function freshFolder(): string {
  return mkdtempSync(join(tmpdir(), 'trimfree-of-'));
}

/** Mounts a tmpfs of `size` on a fresh folder (options e.g. 'ro'); undefined, with the reason printed, if it cannot. */
function mountTmpfs(size: string, extra = ''): string | undefined {
  const dir = freshFolder();
  const r = spawnSync('mount', ['-t', 'tmpfs', '-o', `size=${size}${extra ? `,${extra}` : ''}`, 'tmpfs', dir], { encoding: 'utf8' });
  if (r.status !== 0) {
    console.warn(`cli-output-files: cannot mount a tmpfs here (${isRoot ? 'root, but' : 'not root:'} ${(r.stderr || String(r.error)).trim()}); the full-disk case runs on an injected short write instead`);
    return undefined;
  }
  mounted.push(dir);
  return dir;
}
const mounted: string[] = [];

beforeAll(() => buildIfMissing());
afterAll(() => {
  for (const dir of mounted) spawnSync('umount', [dir]);
});

describe('a full disk: exit 2 with the reason, no partial file and no temporary file (was: a truncated file and exit 0)', { timeout: 120_000 }, () => {
  it('the write loop keeps going after short writes, and a write that takes nothing is "no space" (injected)', async () => {
    // The injected case: a file system that takes at most 7 bytes a call, then at 20 bytes takes nothing.
    const taken: Buffer[] = [];
    const shortWrites = (_fd: number, bytes: Buffer, offset: number, length: number): number => {
      const n = Math.min(7, length);
      taken.push(bytes.subarray(offset, offset + n));
      return n;
    };
    writeWhole(0, 'Ω'.repeat(20), shortWrites);
    expect(Buffer.concat(taken).toString('utf8')).toBe('Ω'.repeat(20));
    let total = 0;
    const fills = (_fd: number, _b: Buffer, _o: number, length: number): number => {
      const n = Math.min(7, length, 20 - total);
      total += n;
      return n;
    };
    expect(() => writeWhole(0, 'x'.repeat(100), fills)).toThrow(/ENOSPC/);
  });

  const writers: Array<[string, (dir: string) => string[], string]> = [
    ['spread --report', (dir) => ['spread', CHARGER, ...QUICK, '--report', join(dir, 'r.html')], '--report'],
    ['schema --out', (dir) => ['schema', '--out', join(dir, 'schema.json')], '--out'],
    ['spread --samples (streamed)', (dir) => ['spread', CHARGER, ...QUICK, '--samples', join(dir, 's.csv')], '--samples'],
  ];
  for (const [name, argsFor, option] of writers) {
    it(`${name} on a nearly full 1 MB tmpfs`, () => {
      const dir = mountTmpfs('1m');
      if (dir === undefined) return; // reason printed; the injected case above covers the loop
      // Leave about 8 kB free: less than any of these files (the schema is about 20 kB).
      const free = (): number => Number(spawnSync('df', ['--output=avail', '-B1', dir], { encoding: 'utf8' }).stdout.split('\n')[1]);
      writeFileSync(join(dir, 'filler'), Buffer.alloc(Math.max(0, free() - 8192)));
      const r = runTrimfree(argsFor(dir));
      expectOneLineError(r, new RegExp(`^trimfree: ${option}: cannot write .*: no space left on device \\(ENOSPC\\); nothing was written; accepted: `));
      expect(readdirSync(dir), 'no partial or temporary file').toEqual(['filler']);
    });
  }
});

describe('targets that are not regular files are refused even with --force (was: /dev/null replaced by a file)', { timeout: 60_000 }, () => {
  it('a character device made in a temporary folder (mknod, as root)', () => {
    const dir = freshFolder();
    const node = join(dir, 'null-device');
    const made = spawnSync('mknod', [node, 'c', '1', '3'], { encoding: 'utf8' });
    if (made.status !== 0) {
      console.warn(`cli-output-files: mknod failed (${isRoot ? 'root, but' : 'not root:'} ${made.stderr.trim()}): the device case is not run; the FIFO case below still is`);
      return;
    }
    const r = runTrimfree(['spread', CHARGER, ...QUICK, '--report', node, '--force']);
    expectOneLineError(r, /^trimfree: --report: .*null-device is a character device, not a regular file; refused even with --force/);
    expect(statSync(node).isCharacterDevice()).toBe(true);
    expect(readdirSync(dir)).toEqual(['null-device']);
  });

  it('a FIFO as --out of schema and as --samples', () => {
    const dir = freshFolder();
    const fifo = join(dir, 'pipe');
    expect(spawnSync('mkfifo', [fifo]).status).toBe(0);
    expectOneLineError(runTrimfree(['schema', '--out', fifo, '--force']), /^trimfree: --out: .*pipe is a named pipe \(FIFO\), not a regular file/);
    expectOneLineError(runTrimfree(['spread', CHARGER, ...QUICK, '--samples', fifo, '--force']), /^trimfree: --samples: .*pipe is a named pipe \(FIFO\)/);
    expect(statSync(fifo).isFIFO()).toBe(true);
  });
});

describe('the same file under two spellings is refused before any work (was: the CSV replaced by the HTML)', { timeout: 60_000 }, () => {
  for (const force of [false, true]) {
    it(`--report same.out --samples ./same.out${force ? ' --force' : ''}`, () => {
      const dir = freshFolder();
      const r = runTrimfree(['spread', CHARGER, ...QUICK, '--report', 'same.out', '--samples', './same.out', ...(force ? ['--force'] : [])], dir);
      expectOneLineError(r, /^trimfree: --report: the same file as --samples \(same\.out and \.\/same\.out\); accepted: two different files$/);
      expect(readdirSync(dir)).toEqual([]);
    });
  }
  it('through a symbolic link to the folder', () => {
    const dir = freshFolder();
    mkdirSync(join(dir, 'real'));
    spawnSync('ln', ['-s', 'real', join(dir, 'link')]);
    const r = runTrimfree(['spread', CHARGER, ...QUICK, '--report', 'real/x.out', '--samples', 'link/x.out'], dir);
    expectOneLineError(r, /^trimfree: --report: the same file as --samples/);
    expect(readdirSync(join(dir, 'real'))).toEqual([]);
  });
});

describe('an unwritable output folder is refused before the analysis (was: found after it)', { timeout: 60_000 }, () => {
  it('a read-only file system: exit 2 at once, naming EROFS, with a run that would take minutes', () => {
    const dir = mountTmpfs('64k', 'ro');
    if (dir === undefined) return; // reason printed
    // 1e9 trials take minutes: an answer within the test's time means the folder was checked first.
    const r = runTrimfree(['spread', CHARGER, '--trials', '1e9', '--report', join(dir, 'r.html')]);
    expectOneLineError(r, /^trimfree: --report: cannot write .*r\.html: read-only file system \(EROFS\); nothing was written/);
  });
});

describe('file names near the 255-byte limit and `--out -`', { timeout: 60_000 }, () => {
  it('a 250-character file name is written (the temporary name is short)', () => {
    const dir = freshFolder();
    const name = `${'r'.repeat(245)}.html`;
    const r = runTrimfree(['spread', CHARGER, ...QUICK, '--report', name], dir);
    expect(r.status, r.stderr).toBe(0);
    expect(readdirSync(dir)).toEqual([name]);
    expect(readFileSync(join(dir, name), 'utf8')).toMatch(/<\/html>\s*$/);
  });

  it('init --out - and schema --out - print to standard output and write no file named "-"', () => {
    const dir = freshFolder();
    const init = runTrimfree(['init', '--kind', 'led', '--out', '-'], dir);
    expect(init.status, init.stderr).toBe(0);
    expect(JSON.parse(init.stdout)).toHaveProperty('voltage');
    const schema = runTrimfree(['schema', '--out', '-'], dir);
    expect(schema.status).toBe(0);
    expect(JSON.parse(schema.stdout)).toHaveProperty('$schema');
    expect(readdirSync(dir)).toEqual([]);
  });

  it('--report - is refused (the report is a file)', () => {
    const dir = freshFolder();
    expectOneLineError(runTrimfree(['spread', CHARGER, ...QUICK, '--report', '-'], dir), /^trimfree: --report: '-' is not a file here/);
  });
});
