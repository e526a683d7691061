// The chunk streams' starting states (src/analysis/chunk-random.ts). The former seeding (seedrandom's xor128 fed the
// string `${seed}:${k}`) is linear over GF(2) in the string's character codes, so the states of chunks 0…3 XOR to
// zero; it is rebuilt here from seedrandom itself as the counter-example each test must reject. The new states come
// from SHA-256 (FIPS 180-4); the tests check the properties a well-mixed seeding has, with binomial bounds.
import { createHash } from 'node:crypto';
import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';
import { chunkRandom, chunkState, chunkStateWords, chunkStreamName } from '../src/analysis/chunk-random.js';

type Words = [number, number, number, number];

function oldState(seed: string, k: number): Words {
  const { x, y, z, w } = seedrandom.xor128(`${seed}:${k}`, { state: true }).state();
  return [x, y, z, w];
}

function newState(seed: string, k: number): Words {
  return [...chunkState(seed, k)] as Words;
}

function xorOf(states: Words[]): Words {
  return states.reduce((acc, s) => acc.map((v, i) => v ^ s[i]!) as Words, [0, 0, 0, 0] as Words);
}

function popcount32(v: number): number {
  let n = 0;
  for (let x = v >>> 0; x !== 0; x >>>= 1) n += x & 1;
  return n;
}

/** True when some aligned group of four consecutive chunks, or a 2×2 square across two seeds, XORs to zero. */
function hasLinearRelation(state: (seed: string, k: number) => Words): boolean {
  for (const seed of ['1', '2', 'run', '42']) {
    for (const start of [0, 4, 10]) {
      const group = [0, 1, 2, 3].map((i) => state(seed, start + i));
      if (xorOf(group).every((v) => v === 0)) return true;
    }
  }
  return xorOf([state('2', 0), state('3', 0), state('2', 1), state('3', 1)]).every((v) => v === 0);
}

describe('chunk seeding', () => {
  it('the former string seeding shows the linear relations (the counter-example is real)', () => {
    expect(xorOf([0, 1, 2, 3].map((k) => oldState('1', k)))).toEqual([0, 0, 0, 0]);
    expect(hasLinearRelation(oldState)).toBe(true);
  });

  it('the SHA-256 seeding shows none of them', () => {
    expect(hasLinearRelation(newState)).toBe(false);
  });

  it('the difference between neighbouring chunks is not the same for every seed (the former one was)', () => {
    const delta = (state: (seed: string, k: number) => Words, seed: string): string => xorOf([state(seed, 5), state(seed, 6)]).join(',');
    const seeds = ['a', 'b', 'c', 'd'];
    expect(new Set(seeds.map((s) => delta(oldState, s))).size).toBe(1);
    expect(new Set(seeds.map((s) => delta(newState, s))).size).toBe(seeds.length);
  });

  it('neighbouring chunks differ in about half of their 128 state bits (avalanche)', () => {
    // 2000 pairs × 128 bits: mean Hamming distance 64, σ of the mean = √32/√2000 ≈ 0.126; allow ±5σ.
    let total = 0;
    const pairs = 2000;
    for (let k = 0; k < pairs; k++) total += xorOf([newState('avalanche', k), newState('avalanche', k + 1)]).reduce((n, v) => n + popcount32(v), 0);
    expect(Math.abs(total / pairs - 64)).toBeLessThan(5 * Math.sqrt(32 / pairs));
  });

  it('the state is the first 16 bytes of SHA-256 of the stream name, read as little-endian words', () => {
    // An independent reading of the digest (hex string → words), not the module's Buffer reads.
    const hex = createHash('sha256').update('trimfree chunk stream\u0000demo\u00007').digest('hex');
    const words = [0, 1, 2, 3].map((i) => {
      const bytes = hex.slice(8 * i, 8 * i + 8).match(/../g)!.reverse().join('');
      return parseInt(bytes, 16) | 0;
    });
    expect(chunkStreamName('demo', 7)).toBe('trimfree chunk stream\u0000demo\u00007');
    expect(newState('demo', 7)).toEqual(words);
    const { x, y, z, w } = chunkStateWords('demo', 7);
    expect([x, y, z, w]).toEqual(words);
  });

  it('the reference generator starts from that state (seedrandom xor128 with the state given)', () => {
    const words = chunkStateWords('ref', 2);
    const expected = seedrandom.xor128('anything', { state: words });
    const random = chunkRandom('ref', 2);
    for (let i = 0; i < 50; i++) expect(random()).toBe(expected());
  });
});
