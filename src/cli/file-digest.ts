// The SHA-256 (FIPS 180-4) of a file's bytes as lowercase hex, so a report can be matched to the design file it was
// made from (`sha256sum FILE` prints the same digest).
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { InputError } from '../errors.js';

export function fileSha256(path: string): string {
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch (error) {
    throw new InputError(path, `cannot read the design file again for its SHA-256 (${(error as NodeJS.ErrnoException).code ?? 'unreadable'})`, 'a design file that stays in place while the command runs');
  }
  return createHash('sha256').update(bytes).digest('hex');
}
