// exactLog (src/tolerance/exact-log.ts), the logarithm both Monte Carlo kernels use, against outside references:
// V8's Math.log (a port of the same fdlibm routine, so the same bits are expected, not just a close value), the
// identities log(1) = 0, log(2^k) = k·ln 2, log(x·y) = log x + log y, and IEEE 754's special values. Then its
// AssemblyScript twin (src/analysis/kernel/assembly/exact-log.ts, in the built kernel) against it, bit for bit.
import { beforeAll, describe, expect, it } from 'vitest';
import seedrandom from 'seedrandom';
import { exactLog } from '../src/tolerance/exact-log.js';
import { instantiateKernel, type KernelExports } from '../src/analysis/kernel/wasm-module.js';
import { ensureKernelBuilt } from './kernel-build.js';

/** Arguments over the whole positive range: random bit patterns, the inverse normal's tail range, subnormals, edges. */
function argumentsToTry(count: number): number[] {
  const random = seedrandom('exact-log');
  const bits = new Float64Array(1);
  const words = new Uint32Array(bits.buffer);
  const xs: number[] = [];
  for (let i = 0; i < count; i++) {
    if (i % 3 === 0) {
      words[0] = Math.floor(random() * 2 ** 32);
      words[1] = Math.floor(random() * 0x7ff00000);
      xs.push(bits[0]!);
    } else if (i % 3 === 1) xs.push(2 ** -33 + random() * 0.02425);
    else xs.push(1 - random() * 0.02425);
  }
  xs.push(5e-324, 2.2250738585072014e-308, 2.225073858507201e-308, 1e-310, 2 ** -33, 0.5, 1, 1 + 2 ** -52, 1 - 2 ** -53, 2, Math.E, 10, 1.7976931348623157e308);
  return xs;
}

const XS = argumentsToTry(600_000);

describe('exactLog', () => {
  it('equals Math.log bit for bit (fdlibm e_log.c in both) on 600 000 arguments across the range', () => {
    let differ = 0;
    for (const x of XS) if (!Object.is(exactLog(x), Math.log(x))) differ++;
    expect(differ).toBe(0);
  });
  it('special values per IEEE 754 / C99 F.9.3.7: log(±0) = −∞, log(x < 0) = NaN, log(+∞) = +∞, log(NaN) = NaN', () => {
    expect(exactLog(0)).toBe(-Infinity);
    expect(exactLog(-0)).toBe(-Infinity);
    expect(exactLog(-1)).toBeNaN();
    expect(exactLog(Infinity)).toBe(Infinity);
    expect(exactLog(NaN)).toBeNaN();
  });
  it('log(1) = 0 exactly; log(2^k) = k·ln 2 to 1 ulp for k from −1074 to 1023', () => {
    expect(Object.is(exactLog(1), 0)).toBe(true);
    for (let k = -1074; k <= 1023; k++) {
      const expected = k * Math.LN2;
      expect(Math.abs(exactLog(2 ** k) - expected)).toBeLessThanOrEqual(Math.abs(expected) * 2 ** -52);
    }
  });
  it('log(x·y) = log x + log y within 4 ulp of the larger term (products that stay exact: y a power of two)', () => {
    const random = seedrandom('exact-log-product');
    for (let i = 0; i < 10_000; i++) {
      const x = 0.5 + random();
      const y = 2 ** Math.floor(random() * 200 - 100);
      const sum = exactLog(x) + exactLog(y);
      expect(Math.abs(exactLog(x * y) - sum)).toBeLessThanOrEqual(4 * 2 ** -52 * Math.max(Math.abs(exactLog(x)), Math.abs(exactLog(y)), 1));
    }
  });
});

describe('the WebAssembly kernel’s exactLog (src/analysis/kernel/assembly/exact-log.ts)', () => {
  let kernel: KernelExports;
  beforeAll(() => {
    ensureKernelBuilt();
    kernel = instantiateKernel();
  });
  it('gives the same bits as the JavaScript exactLog on the same 600 000 arguments and the special values', () => {
    let differ = 0;
    for (const x of [...XS, 0, -0, -1, Infinity, NaN, -Infinity]) if (!Object.is(kernel.exactLog(x), exactLog(x))) differ++;
    expect(differ).toBe(0);
  });
});
