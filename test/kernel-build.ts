// Builds the WebAssembly kernel into dist/ when a test runs before `npm run build:kernel` has (npm test builds it
// first; a single test file run by hand may not have). The same command as the package's build:kernel script.
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { KERNEL_WASM } from '../src/analysis/kernel/wasm-module.js';
import { PROJECT_ROOT } from '../src/project-root.js';

/** The build:kernel script's arguments after `asc`, read from package.json (one source for the command). */
export function kernelBuildArgs(outFile: string): string[] {
  const scripts = (JSON.parse(readFileSync(join(PROJECT_ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> }).scripts;
  const words = scripts['build:kernel']!.split(/\s+/);
  if (words[0] !== 'asc') throw new Error('build:kernel no longer starts with asc');
  const args = words.slice(1);
  const out = args.indexOf('--outFile');
  args[out + 1] = outFile;
  return args;
}

/** Runs the kernel build (AssemblyScript's compiler, from node_modules) writing `outFile`. */
export function buildKernel(outFile: string): void {
  const asc = join(PROJECT_ROOT, 'node_modules', 'assemblyscript', 'bin', 'asc.js');
  execFileSync(process.execPath, [asc, ...kernelBuildArgs(outFile)], { cwd: PROJECT_ROOT, stdio: 'pipe' });
}

export function ensureKernelBuilt(): void {
  if (!existsSync(KERNEL_WASM)) buildKernel(KERNEL_WASM);
}
