// Reads a file a user names as input (a design file, a stock list) with a size cap, and only if it is a regular
// file: a device (/dev/zero), a FIFO, a socket or a folder is refused up front with what it is, so an endless or
// blocking input can neither fill memory nor hang the run. The file is opened non-blocking (a FIFO swapped in after
// the check does not block the open) and checked on the open descriptor, then read to at most the cap plus one byte.
// Any layer may import this file (like errors.ts): it depends on node:fs and the typed errors only.
import { closeSync, constants, fstatSync, openSync, readSync, type Stats } from 'node:fs';
import { InputError } from './errors.js';
import { printableText } from './user-text.js';

export interface InputFileOptions {
  /** The option or argument that named the file, for messages (e.g. '--stock'); the path itself when omitted. */
  where?: string;
  /** Most bytes accepted. */
  maxBytes: number;
  /** What a good input is, for the "accepted" part of messages. */
  accepted: string;
}

/** The file's text (UTF-8); InputError for a missing, unreadable, non-regular or too large file. */
export function readInputText(path: string, options: InputFileOptions): string {
  const where = options.where ?? printableText(path);
  // Named by an option, the message names the file; named by itself (a design file argument), it need not.
  const shown = options.where === undefined ? '' : `'${printableText(path)}' `;
  let fd: number;
  try {
    fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (error) {
    throw new InputError(where, unreadable(error, shown), options.accepted);
  }
  try {
    const stats = fstatSync(fd);
    if (stats.isDirectory()) throw new InputError(where, `${shown}is a folder, not a file`, options.accepted);
    if (!stats.isFile()) throw new InputError(where, `${shown}is ${fileKind(stats)}, not a regular file`, options.accepted);
    if (stats.size > options.maxBytes) throw tooLarge(where, shown, options);
    // Read to the end, but never past the cap plus one byte, whatever size was reported (a file still growing, or
    // one that reports no size at all such as those under /proc, is read as it is).
    let buffer = Buffer.alloc(Math.min(stats.size, options.maxBytes) + 1);
    let length = 0;
    for (;;) {
      if (length === buffer.length) {
        if (length > options.maxBytes) throw tooLarge(where, shown, options);
        const grown = Buffer.alloc(Math.min(buffer.length * 2, options.maxBytes + 1));
        buffer.copy(grown, 0, 0, length);
        buffer = grown;
      }
      const n = readSync(fd, buffer, length, buffer.length - length, null);
      if (n === 0) break;
      length += n;
    }
    if (length > options.maxBytes) throw tooLarge(where, shown, options);
    return buffer.toString('utf8', 0, length);
  } catch (error) {
    if (error instanceof InputError) throw error;
    throw new InputError(where, unreadable(error, shown), options.accepted);
  } finally {
    closeSync(fd);
  }
}

function tooLarge(where: string, shown: string, options: InputFileOptions): InputError {
  return new InputError(where, `${shown}is larger than ${formatBytes(options.maxBytes)}, the most accepted`, options.accepted);
}

function formatBytes(bytes: number): string {
  return bytes % 2 ** 20 === 0 ? `${bytes / 2 ** 20} MB` : `${bytes} bytes`;
}

function unreadable(error: unknown, shown: string): string {
  const code = (error as NodeJS.ErrnoException).code ?? 'unreadable';
  const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : `cannot read it (${code})`;
  return shown === '' ? reason : `cannot read ${shown.trim()} (${reason.replace(/^cannot read it \((.*)\)$/, '$1')})`;
}

/** What a non-regular file is, in words. */
export function fileKind(stats: Stats): string {
  if (stats.isDirectory()) return 'a folder';
  if (stats.isCharacterDevice()) return 'a character device';
  if (stats.isBlockDevice()) return 'a block device';
  if (stats.isFIFO()) return 'a named pipe (FIFO)';
  if (stats.isSocket()) return 'a socket';
  return 'not a regular file';
}
