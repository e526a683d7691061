import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, describeError } from '../src/errors.js';
import { removePendingTemporaries, writeOutputFile, writeOutputFileStreaming } from '../src/cli/output-file.js';

function freshFolder(): string {
  return mkdtempSync(join(tmpdir(), 'trimfree-out-'));
}

describe('writeOutputFile: never overwrites without --force, never leaves a partial file', () => {
  it('writes a new file and leaves no temporary file beside it', () => {
    const dir = freshFolder();
    const path = join(dir, 'report.html');
    writeOutputFile(path, '<p>ok</p>', { force: false });
    expect(readFileSync(path, 'utf8')).toBe('<p>ok</p>');
    expect(readdirSync(dir)).toEqual(['report.html']);
  });

  it('refuses to overwrite an existing file without force, names --force, and leaves the file untouched', () => {
    const dir = freshFolder();
    const path = join(dir, 'samples.csv');
    writeFileSync(path, 'precious');
    let caught: unknown;
    try {
      writeOutputFile(path, 'new', { force: false, where: '--samples' });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InputError);
    const line = describeError(caught as InputError);
    expect(line).toMatch(/^--samples: /);
    expect(line).toContain('--force');
    expect(readFileSync(path, 'utf8')).toBe('precious');
    expect(readdirSync(dir)).toEqual(['samples.csv']);
  });

  it('replaces an existing file with force', () => {
    const dir = freshFolder();
    const path = join(dir, 'out.json');
    writeFileSync(path, 'old');
    writeOutputFile(path, 'new', { force: true });
    expect(readFileSync(path, 'utf8')).toBe('new');
    expect(readdirSync(dir)).toEqual(['out.json']);
  });

  it('a failure while writing removes the temporary file and leaves the old file intact', () => {
    const dir = freshFolder();
    const path = join(dir, 'out.json');
    writeFileSync(path, 'old');
    // A value writeSync rejects makes the write fail after the temporary file was created.
    const bad = Symbol('not text') as unknown as string;
    expect(() => writeOutputFile(path, bad, { force: true })).toThrow();
    expect(readFileSync(path, 'utf8')).toBe('old');
    expect(readdirSync(dir)).toEqual(['out.json']);
  });

  it('a missing folder or a folder as target is an InputError naming the option', () => {
    const dir = freshFolder();
    expect(() => writeOutputFile(join(dir, 'no', 'such.html'), 'x', { force: true, where: '--report' })).toThrow(InputError);
    expect(() => writeOutputFile(dir, 'x', { force: true, where: '--report' })).toThrow(/folder/);
  });
});

describe('writeOutputFileStreaming: the same guarantees for a file written piece by piece', () => {
  const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

  it('writes the pieces in order (multi-byte UTF-8 included), only a temporary file while writing, then the file alone', async () => {
    const dir = freshFolder();
    const path = join(dir, 'samples.csv');
    const seen: string[][] = [];
    await writeOutputFileStreaming(path, async (write) => {
      write('trial,R (Ω)\r\n');
      for (let j = 0; j < 3; j++) {
        write(`${j},${1000 + j}\r\n`);
        seen.push(readdirSync(dir));
        await pause();
      }
    }, { force: false, where: '--samples' });
    expect(readFileSync(path, 'utf8')).toBe('trial,R (Ω)\r\n0,1000\r\n1,1001\r\n2,1002\r\n');
    for (const names of seen) expect(names).toEqual([expect.stringMatching(/^\.tf-[A-Za-z0-9_-]{6}$/)]);
    expect(readdirSync(dir)).toEqual(['samples.csv']);
  });

  it('refuses an existing file without force before writing anything (the writer is never called)', async () => {
    const dir = freshFolder();
    const path = join(dir, 'samples.csv');
    writeFileSync(path, 'precious');
    let called = false;
    await expect(writeOutputFileStreaming(path, () => { called = true; }, { force: false, where: '--samples' })).rejects.toThrow(/samples\.csv already exists and would be overwritten/);
    expect(called).toBe(false);
    expect(readFileSync(path, 'utf8')).toBe('precious');
    expect(readdirSync(dir)).toEqual(['samples.csv']);
  });

  it('a writer that fails half-way (thrown or rejected) leaves no temporary file and the old file intact; its error passes through', async () => {
    for (const fail of ['throw', 'reject'] as const) {
      const dir = freshFolder();
      const path = join(dir, 'samples.csv');
      writeFileSync(path, 'old');
      const broken = new Error('the model failed');
      const writer = fail === 'throw'
        ? (write: (t: string) => void): void => { write('0,1\r\n'); throw broken; }
        : async (write: (t: string) => void): Promise<void> => { write('0,1\r\n'); await pause(); write('1,2\r\n'); throw broken; };
      await expect(writeOutputFileStreaming(path, writer, { force: true, where: '--samples' })).rejects.toBe(broken);
      expect(readFileSync(path, 'utf8')).toBe('old');
      expect(readdirSync(dir)).toEqual(['samples.csv']);
    }
  });

  it('a file that appears while the stream is written is not replaced (without force): InputError naming the option', async () => {
    const dir = freshFolder();
    const path = join(dir, 'samples.csv');
    let caught: unknown;
    try {
      await writeOutputFileStreaming(path, async (write) => {
        write('0,1\r\n');
        await pause();
        writeFileSync(path, 'someone else\'s');
        write('1,2\r\n');
      }, { force: false, where: '--samples' });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect(describeError(caught as InputError)).toMatch(/^--samples: .*already exists and would be overwritten; accepted: .*--force/);
    expect(readFileSync(path, 'utf8')).toBe('someone else\'s');
    expect(readdirSync(dir)).toEqual(['samples.csv']);
  });

  it("the interrupt handler's cleanup (removePendingTemporaries) removes the temporary file mid-stream", async () => {
    const dir = freshFolder();
    const path = join(dir, 'samples.csv');
    let during: string[] = [];
    let after: string[] = [];
    const stop = new Error('interrupted');
    await expect(writeOutputFileStreaming(path, async (write) => {
      write('0,1\r\n');
      await pause();
      during = readdirSync(dir);
      removePendingTemporaries(); // what src/cli/main.ts does on SIGINT before it exits
      after = readdirSync(dir);
      throw stop; // the process would exit here
    }, { force: false })).rejects.toBe(stop);
    expect(during).toHaveLength(1);
    expect(after).toEqual([]);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a write after the writer has returned is refused (the file is already complete)', async () => {
    const dir = freshFolder();
    const path = join(dir, 'out.csv');
    let kept: ((t: string) => void) | undefined;
    await writeOutputFileStreaming(path, (write) => { write('a\r\n'); kept = write; }, { force: false });
    expect(() => kept!('b\r\n')).toThrow(/after its writer returned/);
    expect(readFileSync(path, 'utf8')).toBe('a\r\n');
  });
});
