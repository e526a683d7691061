// Writes a file a command produces (JSON, CSV, HTML report) without ever damaging what is already there:
// refuses to overwrite an existing file unless --force was given, and writes through a temporary file in the
// same folder that is renamed over the target only once it is complete (rename is atomic within one file
// system on POSIX), so a failure or an interrupt never leaves a partial file behind.
import { closeSync, existsSync, fsyncSync, linkSync, openSync, renameSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../errors.js';

export interface WriteOptions {
  /** Replace an existing file (the --force option). */
  force: boolean;
  /** Name used in error messages, e.g. '--report'; defaults to the path itself. */
  where?: string;
}

/** Temporary files currently being written, removed if the process is interrupted. */
const pendingTemporaries = new Set<string>();

/** Removes every temporary file still being written (called on SIGINT by the CLI before it exits). */
export function removePendingTemporaries(): void {
  for (const path of pendingTemporaries) {
    try {
      unlinkSync(path);
    } catch {
      // already gone
    }
  }
  pendingTemporaries.clear();
}

/** Writes `text` to `path` atomically; throws InputError when the file exists and force is false. */
export function writeOutputFile(path: string, text: string, options: WriteOptions): void {
  const where = options.where ?? path;
  const target = resolve(path);
  const folder = dirname(target);
  if (!existsSync(folder) || !statSync(folder).isDirectory()) {
    throw new InputError(where, `the folder ${folder} does not exist`, 'a file path in an existing folder');
  }
  if (existsSync(target)) {
    if (statSync(target).isDirectory()) {
      throw new InputError(where, `${path} is a folder, not a file`, 'a file path');
    }
    if (!options.force) {
      throw new InputError(where, `${path} already exists and would be overwritten`, 'a new file name, or --force to replace it');
    }
  }
  const temporary = join(folder, `.${basename(target)}.${process.pid}.${Date.now().toString(36)}.tmp`);
  pendingTemporaries.add(temporary);
  try {
    const fd = openSync(temporary, 'wx', 0o644);
    try {
      writeSync(fd, text);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    if (options.force) {
      renameSync(temporary, target);
    } else {
      // link() fails with EEXIST if the file appeared meanwhile, so a file created by someone else between the
      // check above and now is never replaced either.
      linkSync(temporary, target);
      unlinkSync(temporary);
    }
  } catch (error) {
    try {
      unlinkSync(temporary);
    } catch {
      // never created, or already renamed
    }
    if (isErrno(error) && error.code === 'EEXIST') {
      throw new InputError(where, `${path} already exists and would be overwritten`, 'a new file name, or --force to replace it');
    }
    if (isErrno(error)) {
      throw new InputError(where, `cannot write ${path} (${String(error.code)})`, 'a writable file path');
    }
    throw error;
  } finally {
    pendingTemporaries.delete(temporary);
  }
}

function isErrno(error: unknown): error is NodeJS.ErrnoException {
  return error instanceof Error && typeof (error as NodeJS.ErrnoException).code === 'string';
}
