// The xor128 jump-ahead (src/analysis/kernel/xor128-jump.ts) against stepping the generator one draw at a time
// (chunk-random.ts skipXor128, itself checked against seedrandom's xor128 in test/engine-fast-paths.test.ts): the
// state after n steps must be the same words for every n tried, including 0, 1, odd lengths and the chunk size.
import { describe, expect, it } from 'vitest';
import { chunkState, skipXor128 } from '../src/analysis/chunk-random.js';
import { applyBitMatrix, jumpMatrix, xor128Step } from '../src/analysis/kernel/xor128-jump.js';

describe('xor128 jump-ahead', () => {
  it('one step of the matrix code equals the generator’s step (skipXor128 by 1)', () => {
    const a = chunkState('jump', 0);
    const b = a.slice();
    xor128Step(a);
    skipXor128(b, 1);
    expect([...a]).toEqual([...b]);
  });
  for (const n of [0, 1, 2, 3, 4, 5, 31, 1001, 4096, 65_535, 65_536, 100_003]) {
    it(`Mⁿ applied to a state equals n steps of the generator (n = ${n}), for three chunk states`, () => {
      for (const k of [0, 1, 7]) {
        const start = chunkState('jump', k);
        const stepped = start.slice();
        skipXor128(stepped, n);
        const jumped = new Int32Array(4);
        applyBitMatrix(jumpMatrix(n), start, jumped);
        expect([...jumped]).toEqual([...stepped]);
      }
    });
  }
  it('jumping twice by n equals one jump by 2n (the stretches of consecutive parts)', () => {
    const s = chunkState('jump', 3);
    const once = new Int32Array(4);
    applyBitMatrix(jumpMatrix(2 * 4096), s, once);
    const twice = s.slice();
    applyBitMatrix(jumpMatrix(4096), twice, twice);
    applyBitMatrix(jumpMatrix(4096), twice, twice);
    expect([...twice]).toEqual([...once]);
  });
});
