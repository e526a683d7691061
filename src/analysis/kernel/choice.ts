// Which kernel computes a run's chunks: the JavaScript reference (src/analysis/chunk.ts) or the WebAssembly kernel
// (src/analysis/kernel/assembly/chunk-kernel.ts through wasm-runner.ts). `auto` takes the WebAssembly kernel for every supply spec it
// implements (kernelSupports) and the reference otherwise; the choice depends only on the spec, never on the
// machine, and both give the same numbers (test/wasm-kernel.test.ts).
import { InputError } from '../../errors.js';
import { ChunkRunner, type ChunkConfig, type ChunkSummary } from '../chunk.js';
import type { Model } from '../model.js';
import type { ModelSource } from '../model-source.js';
import { kernelSupports } from './supports.js';
import { WasmChunkRunner } from './wasm-runner.js';

import type { KernelChoice, KernelName } from './kernel-choices.js';

export type { KernelChoice, KernelName } from './kernel-choices.js';

/** The kernel a run uses. Throws InputError when `wasm` is asked for a design the kernel does not implement. */
export function chooseKernel(choice: KernelChoice, source: ModelSource | undefined): KernelName {
  if (choice === 'js') return 'js';
  const supported = source !== undefined && source.kind === 'supply' && kernelSupports(source.spec);
  if (supported) return 'wasm';
  if (choice === 'wasm') throw new InputError('--kernel', 'the wasm kernel does not implement this design (a field it does not know)', 'js or auto (auto runs such a design on js)');
  return 'js';
}

/** What computes one chunk: ChunkRunner or WasmChunkRunner. */
export interface ChunkComputer {
  run(k: number): ChunkSummary;
  /** Called once the runner is done with (its summaries consumed): gives back what it borrowed. */
  release?(): void;
}

/** A chunk runner of the kernel config.kernel names (the reference without one). */
export function createChunkRunner(model: Model, config: ChunkConfig, source: ModelSource | undefined, reuse = false): ChunkComputer {
  if (config.kernel === 'wasm') {
    if (!source || source.kind !== 'supply') throw new Error('the wasm kernel needs the supply spec the model was built from');
    return new WasmChunkRunner(source.spec, model, config, reuse);
  }
  return new ChunkRunner(model, config, reuse);
}

/** The method note that says which kernel ran. */
export function kernelNote(kernel: KernelName): string {
  return kernel === 'wasm'
    ? 'Kernel: wasm (the WebAssembly chunk kernel; the same operations in the same order as the JavaScript reference, so the same numbers).'
    : 'Kernel: js (the JavaScript reference chunk kernel).';
}
