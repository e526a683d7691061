// The stock-list reader: plain lists in any notation, CSV with a value column, and errors that name the line.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.js';
import { parseStockText, readStockFile } from '../src/series/stock.js';

describe('stock list', () => {
  it('one value a line in mixed notation, comments and blanks skipped, sorted and de-duplicated', () => {
    // 4K7 = 4.7k = 4700 Ω (IEC 60062 code), 1M0 = 1 MΩ, 220R = 220 Ω.
    expect(parseStockText('# drawer 3\n4K7\n\n4.7k\n220R\n1M0\n 10 kΩ \n', 'stock')).toEqual([220, 4700, 10000, 1e6]);
  });
  it('a CSV with a value column (any position, quoted, semicolons)', () => {
    expect(parseStockText('qty,Value,mpn\n100,28K7,X1\n50,"3.3k",X2\n', 'stock')).toEqual([3300, 28700]);
    expect(parseStockText('value;qty\r\n1k;5\r\n2k2;5\r\n', 'stock')).toEqual([1000, 2200]);
  });
  it('a bad value names its line', () => {
    expect(() => parseStockText('1k\n2k2\n4x7\n', 'stock')).toThrow(InputError);
    try {
      parseStockText('1k\n2k2\n4x7\n', 'stock');
    } catch (error) {
      expect((error as InputError).where).toBe('stock line 3');
    }
    expect(() => parseStockText('qty,value\n5,1k\n6,\n', 'stock')).toThrow(/value column is empty/);
  });
  it('a CSV without a value column, an empty list, a missing file', async () => {
    expect(() => parseStockText('qty,ohms\n1,1k\n', 'stock')).toThrow(/no "value" column/);
    expect(() => parseStockText('# nothing\n\n', 'stock')).toThrow(/empty/);
    await expect(readStockFile('/nonexistent/stock.txt', '--stock')).rejects.toThrow(/cannot read/);
  });
  it('reads a file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'trimfree-stock-'));
    const path = join(dir, 'stock.txt');
    writeFileSync(path, '10k\n1k\n');
    expect(await readStockFile(path, '--stock')).toEqual([1000, 10000]);
  });
});
