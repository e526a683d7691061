// Writes a file a command produces (JSON, CSV, HTML report) without ever damaging what is already there:
// refuses to overwrite an existing file unless --force was given, and writes through a temporary file in the
// same folder that is renamed over the target only once it is complete (rename is atomic within one file
// system on POSIX), so a failure or an interrupt never leaves a partial file behind. Two ways in: the whole text at
// once (`writeOutputFile`), or text made piece by piece and written as it comes (`writeOutputFileStreaming`, for
// files too large to hold in memory, such as the samples CSV); both go through the same checks and the same
// temporary-file-then-rename, and the temporary file is in `pendingTemporaries` while it is being written, so the
// CLI's Ctrl-C handler (src/cli/main.ts) removes it.
import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, fsyncSync, linkSync, openSync, realpathSync, renameSync, statSync, unlinkSync, writeSync, type Stats } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError } from '../errors.js';
import { fileKind } from '../input-file.js';
import { printableText } from '../user-text.js';

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

/** Writes `text` to `path` atomically; throws InputError when the file exists and force is false, and for any
 * file-system failure (no space, read-only, no permission), with the operating system's reason. */
export function writeOutputFile(path: string, text: string, options: WriteOptions): void {
  const target = checkedTarget(path, options);
  const temporary = startTemporary(target);
  try {
    const fd = openSync(temporary, 'wx', 0o644);
    try {
      writeWhole(fd, text);
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

/**
 * Refuses, before any work, a target that could not be written: `-` (standard output is not a file here), a missing
 * folder, a folder that cannot take a new file (read-only, no permission: found by creating and removing a probe file
 * in it), an existing target that is not a regular file (folder, device, FIFO, socket: refused even with force, since
 * a rename would replace the device node itself), or an existing file without force. Returns the absolute path.
 */
export function checkOutputTarget(path: string, options: WriteOptions): string {
  const where = options.where ?? path;
  if (path === '-') throw new InputError(where, "'-' is not a file here (this option writes a file, not standard output)", 'a file path');
  if (path === '') throw new InputError(where, 'empty file name', 'a file path');
  const target = resolve(path);
  const folder = dirname(target);
  if (!existsSync(folder) || !statSync(folder).isDirectory()) {
    throw new InputError(where, `the folder ${printableText(folder)} does not exist`, 'a file path in an existing folder');
  }
  const existing = statOrUndefined(target);
  if (existing !== undefined) {
    if (existing.isDirectory()) throw new InputError(where, `${printableText(path)} is a folder, not a file`, 'a file path');
    if (!existing.isFile()) {
      throw new InputError(where, `${printableText(path)} is ${fileKind(existing)}, not a regular file; refused even with --force`, 'a path to a regular file or a new file name');
    }
    if (!options.force) {
      throw new InputError(where, `${printableText(path)} already exists and would be overwritten`, 'a new file name, or --force to replace it');
    }
  }
  probeFolder(folder, path, options);
  return target;
}

/** The same file under two spellings (`same.out` and `./same.out`, a symbolic link to it): compares the real path of
 * each folder plus the file name, so it works before either file exists. */
export function sameOutputFile(a: string, b: string): boolean {
  return realTarget(a) === realTarget(b);
}

function realTarget(path: string): string {
  const target = resolve(path);
  const existing = statOrUndefined(target);
  if (existing !== undefined) {
    try {
      return realpathSync(target);
    } catch {
      // fall through to the folder's real path
    }
  }
  try {
    return join(realpathSync(dirname(target)), basename(target));
  } catch {
    return target;
  }
}

function statOrUndefined(path: string): Stats | undefined {
  try {
    return statSync(path);
  } catch {
    return undefined;
  }
}

/** Creates and removes a temporary file in the folder, so a read-only or no-permission folder is refused before the
 * run rather than after it. */
function probeFolder(folder: string, path: string, options: WriteOptions): void {
  const probe = join(folder, temporaryName());
  try {
    closeSync(openSync(probe, 'wx', 0o644));
    unlinkSync(probe);
  } catch (error) {
    throw failure(error, probe, path, options);
  }
}

function checkedTarget(path: string, options: WriteOptions): string {
  return checkOutputTarget(path, options);
}

/** A short temporary name (`.tf-` and 6 random letters), so a target name near the file system's 255-byte limit
 * still has room; random bytes from node:crypto (a temporary name, not a figure). */
function temporaryName(): string {
  return `.tf-${randomBytes(6).toString('base64url').slice(0, 6)}`;
}

/** A fresh temporary file name beside the target, registered for removal on interrupt. */
function startTemporary(target: string): string {
  const temporary = join(dirname(target), temporaryName());
  pendingTemporaries.add(temporary);
  return temporary;
}

/** Writes all of `text`, however many write calls the file system takes for it. */
export function writeWhole(fd: number, text: string, write: (fd: number, bytes: Buffer, offset: number, length: number) => number = writeSync): void {
  const bytes = Buffer.from(text, 'utf8');
  for (let done = 0; done < bytes.length; ) {
    const wrote = write(fd, bytes, done, bytes.length - done);
    // A file system that takes nothing and reports no error would loop for ever: say so as no space.
    if (!(wrote > 0)) throw Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC', syscall: 'write' });
    done += wrote;
  }
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
    return new InputError(where, `${printableText(path)} already exists and would be overwritten`, 'a new file name, or --force to replace it');
  }
  if (isErrno(error)) {
    return new InputError(where, `cannot write ${printableText(path)}: ${osReason(error)}; nothing was written`, 'a writable file path with room for the file');
  }
  return error;
}

/** The operating system's own words and code, e.g. "no space left on device (ENOSPC)". */
function osReason(error: NodeJS.ErrnoException): string {
  const words = /^[A-Z0-9]+: ([^,]+)/.exec(error.message)?.[1];
  return words === undefined ? String(error.code) : `${words} (${String(error.code)})`;
}

/** An error the operating system returned for a file-system call (not a bug of ours that happens to carry a code). */
function isErrno(error: unknown): error is NodeJS.ErrnoException {
  return error instanceof Error && typeof (error as NodeJS.ErrnoException).code === 'string' && typeof (error as NodeJS.ErrnoException).syscall === 'string';
}
