import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, describeError } from '../src/errors.js';
import { writeOutputFile } from '../src/cli/output-file.js';

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
