// readInputText (src/input-file.ts): regular files only, read whole up to a cap and refused past it, whatever size
// the file system reports. Checked against files made here and the kernel's own /proc and /dev nodes.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readInputText } from '../src/input-file.js';
import { printableText } from '../src/user-text.js';

const dir = mkdtempSync(join(tmpdir(), 'trimfree-input-'));
const accepted = 'a small text file';

describe('readInputText', () => {
  it('reads a file of exactly the cap, and refuses one byte more with the cap in the message', () => {
    writeFileSync(join(dir, 'at-cap.txt'), 'x'.repeat(100));
    expect(readInputText(join(dir, 'at-cap.txt'), { maxBytes: 100, accepted })).toBe('x'.repeat(100));
    writeFileSync(join(dir, 'over.txt'), 'x'.repeat(101));
    expect(() => readInputText(join(dir, 'over.txt'), { where: '--stock', maxBytes: 100, accepted })).toThrow(/is larger than 100 bytes, the most accepted/);
  });

  it('reads a file that reports size 0 (/proc) to its end, not to the reported size', () => {
    const text = readInputText('/proc/self/status', { maxBytes: 1 << 20, accepted });
    expect(text).toMatch(/^Name:/);
    expect(text).toMatch(/\nPid:\s+\d+/);
  });

  it('refuses devices and folders by what they are, without reading them', () => {
    expect(() => readInputText('/dev/zero', { maxBytes: 100, accepted })).toThrow(/is a character device, not a regular file/);
    expect(() => readInputText(dir, { maxBytes: 100, accepted })).toThrow(/is a folder, not a file/);
    expect(() => readInputText(join(dir, 'none'), { maxBytes: 100, accepted })).toThrow(/no such file/);
  });
});

describe('printableText', () => {
  it('escapes control characters and cuts long text with an ellipsis at the stated length', () => {
    expect(printableText('a\u001b[2Jb\r\n\u0000\u007f\u202e')).toBe('a\\x1b[2Jb\\r\\n\\x00\\x7f\\u202e');
    expect(printableText('k'.repeat(200))).toBe(`${'k'.repeat(79)}…`);
    expect(printableText('ok: 4.7 kΩ ±1 %')).toBe('ok: 4.7 kΩ ±1 %');
  });
});
