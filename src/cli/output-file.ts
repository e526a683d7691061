// Writes a file a command produces (JSON, CSV, HTML report) without ever damaging what is already there:
// refuses to overwrite an existing file unless --force was given, and writes through a temporary file in the
// same folder that is renamed over the target only once it is complete (rename is atomic within one file
// system on POSIX), so a failure or an interrupt never leaves a partial file behind. Two ways in: the whole text at
// once (`writeOutputFile`), or text made piece by piece and written as it comes (`writeOutputFileStreaming`, for
// files too large to hold in memory, such as the samples CSV); both go through the same checks and the same
// temporary-file-then-rename, and the temporary file is in `pendingTemporaries` while it is being written, so the
// CLI's Ctrl-C handler (src/cli/main.ts) removes it.
import { closeSync, existsSync, fsyncSync, linkSync, openSync, renameSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../errors.js';

export interface WriteOptions {
  /** Replace an existing file (the --force option). */
  force: boolean;
  /** Name used in error messages, e.g. '--report'; defaults to the path itself. */
  where?: string;
}

/** Appends text to the file being written (UTF-8). */
export type WriteText = (text: string) => void;

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
  const target = checkedTarget(path, options);
  const temporary = startTemporary(target);
  try {
    const fd = openSync(temporary, 'wx', 0o644);
    try {
      writeSync(fd, text);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    publish(temporary, target, options.force);
  } catch (error) {
    throw failure(error, temporary, path, options);
  } finally {
    pendingTemporaries.delete(temporary);
  }
}

/**
 * Writes a file made piece by piece: `writeChunks` is called once with a `write` function and calls it for each
 * piece of text in order (it may pause between pieces, returning a promise, so Ctrl-C is answered while a large file
 * is written). Each piece goes straight to the temporary file, so memory holds one piece, not the file. Same
 * guarantees as writeOutputFile: the target appears whole or not at all, never over an existing file without force;
 * if `writeChunks` throws or rejects, or a write fails, the temporary file is removed and the error is thrown on
 * (a file-system error as an InputError naming `where`).
 */
export async function writeOutputFileStreaming(
  path: string,
  writeChunks: (write: WriteText) => void | Promise<void>,
  options: WriteOptions,
): Promise<void> {
  const target = checkedTarget(path, options);
  const temporary = startTemporary(target);
  try {
    const fd = openSync(temporary, 'wx', 0o644);
    let open = true;
    try {
      await writeChunks((text) => {
        if (!open) throw new Error(`write to ${path} after its writer returned`);
        writeWhole(fd, text);
      });
      fsyncSync(fd);
    } finally {
      open = false;
      closeSync(fd);
    }
    publish(temporary, target, options.force);
  } catch (error) {
    throw failure(error, temporary, path, options);
  } finally {
    pendingTemporaries.delete(temporary);
  }
}

/** The absolute target path, once it is known to be writable: its folder exists, it is not a folder, and it does
 * not exist yet unless force. */
function checkedTarget(path: string, options: WriteOptions): string {
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
  return target;
}

/** A fresh temporary file name beside the target, registered for removal on interrupt. */
function startTemporary(target: string): string {
  const temporary = join(dirname(target), `.${basename(target)}.${process.pid}.${Date.now().toString(36)}.tmp`);
  pendingTemporaries.add(temporary);
  return temporary;
}

/** Writes all of `text`, however many write calls the file system takes for it. */
function writeWhole(fd: number, text: string): void {
  const bytes = Buffer.from(text, 'utf8');
  for (let done = 0; done < bytes.length; ) done += writeSync(fd, bytes, done, bytes.length - done);
}

/** Puts the complete temporary file in place of the target. */
function publish(temporary: string, target: string, force: boolean): void {
  if (force) {
    renameSync(temporary, target);
  } else {
    // link() fails with EEXIST if the file appeared meanwhile, so a file created by someone else between the
    // check above and now is never replaced either.
    linkSync(temporary, target);
    unlinkSync(temporary);
  }
}

/** Removes the temporary file after a failure and says what went wrong: an InputError for the file system's
 * refusals (no space, no permission, the target appearing meanwhile), anything else unchanged. */
function failure(error: unknown, temporary: string, path: string, options: WriteOptions): unknown {
  try {
    unlinkSync(temporary);
  } catch {
    // never created, or already renamed
  }
  const where = options.where ?? path;
  if (isErrno(error) && error.code === 'EEXIST') {
    return new InputError(where, `${path} already exists and would be overwritten`, 'a new file name, or --force to replace it');
  }
  if (isErrno(error)) {
    return new InputError(where, `cannot write ${path} (${String(error.code)})`, 'a writable file path');
  }
  return error;
}

/** An error the operating system returned for a file-system call (not a bug of ours that happens to carry a code). */
function isErrno(error: unknown): error is NodeJS.ErrnoException {
  return error instanceof Error && typeof (error as NodeJS.ErrnoException).code === 'string' && typeof (error as NodeJS.ErrnoException).syscall === 'string';
}
