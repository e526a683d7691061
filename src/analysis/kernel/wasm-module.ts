// The compiled kernel (src/analysis/kernel/assembly/chunk-kernel.ts → dist/src/analysis/kernel/chunk-kernel.wasm, built by
// `npm run build:kernel`, which `npm ci`, `npm test` and `npm run bench` run). Compiled once per thread and
// instantiated once per chunk runner, each instance with its own memory.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PROJECT_ROOT } from '../../project-root.js';

export const KERNEL_WASM = join(PROJECT_ROOT, 'dist', 'src', 'analysis', 'kernel', 'chunk-kernel.wasm');

/** Bytes at the start of the kernel's memory that the kernel keeps for itself (chunk-kernel.ts KERNEL_SCRATCH): lay
 *  nothing there. */
export const KERNEL_SCRATCH_BYTES = 2048;

/** The kernel's exports (addresses are byte offsets into `memory`). */
export interface KernelExports {
  memory: WebAssembly.Memory;
  generate(groups: number, count: number, n: number, offset: number): void;
  transform(desc: number, parts: number, cols: number, stride: number, n: number, tails: number): void;
  evaluate(lay: number, par: number, cols: number, stride: number, n: number, out: number, fixedT: number): void;
  reduce(x: number, n: number, lo: number, scale: number, bins: number, counts: number, specLo: number, specHi: number, res: number): void;
  markInside(x: number, n: number, lo: number, hi: number, pass: number): void;
  markAll(rows: number, count: number, rowStride: number, n: number, all: number): void;
  countOnes(flags: number, n: number): number;
  countAllInside(rows: number, count: number, n: number): number;
  exactLog(x: number): number;
  /** The paired grade search's window marks (src/analysis/kernel/wasm-evaluator.ts), after the chunk kernel's exports. */
  markWindows(rows: number, count: number, n: number, pass: number, rowStride: number): void;
}

// The few WebAssembly JavaScript API types used here (the project's lib setting, ES2022, does not declare them).
declare namespace WebAssembly {
  interface Memory {
    readonly buffer: ArrayBuffer;
    grow(pages: number): number;
  }
  interface Module {
    readonly __module: never;
  }
}
interface WebAssemblyApi {
  Module: new (bytes: Uint8Array) => WebAssembly.Module;
  Instance: new (module: WebAssembly.Module, imports: object) => { exports: object };
}
const wasm = (globalThis as unknown as { WebAssembly: WebAssemblyApi }).WebAssembly;

let compiled: WebAssembly.Module | null = null;

/** A fresh instance of the kernel. Throws, saying how to build it, when the .wasm is missing. */
export function instantiateKernel(): KernelExports {
  if (compiled === null) {
    if (!existsSync(KERNEL_WASM)) throw new Error(`the WebAssembly kernel ${KERNEL_WASM} is missing: build it with npm run build:kernel`);
    compiled = new wasm.Module(readFileSync(KERNEL_WASM));
  }
  return new wasm.Instance(compiled, {}).exports as unknown as KernelExports;
}

/**
 * Instances given back by chunk runners that finished, kept (per thread, at most KEPT_INSTANCES) for the next runner:
 * a new instance's memory is fresh pages, which the system zeroes, and a study of ten grade rows paid for about 300 MB
 * of them (grades on the LED example: 0.52 s of system time against 0.21 s for one spread). A borrowed instance's
 * memory holds what its last user left: the borrower zeroes what it needs zero.
 */
const kept: KernelExports[] = [];
const KEPT_INSTANCES = 2;

export function borrowKernel(): KernelExports {
  return kept.pop() ?? instantiateKernel();
}

export function giveBackKernel(kernel: KernelExports): void {
  if (kept.length < KEPT_INSTANCES && !kept.includes(kernel)) kept.push(kernel);
}
