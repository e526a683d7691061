// Shared by the CLI tests: run the built trimfree as a user would (a subprocess of dist/), and the one-line-error check.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { expect } from 'vitest';
import { PROJECT_ROOT } from '../src/project-root.js';

/** The built entry point (npm test builds dist/ first). */
export const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');

export interface CliRun {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Builds dist/ when a test file runs on its own before any build. */
export function buildIfMissing(): void {
  if (!existsSync(MAIN)) execFileSync(process.execPath, [join(PROJECT_ROOT, 'node_modules', 'typescript', 'bin', 'tsc'), '-p', PROJECT_ROOT]);
}

/** `trimfree ARGS…` in a subprocess, in `cwd` when given. */
export function runTrimfree(args: string[], cwd?: string): CliRun {
  const run = spawnSync(process.execPath, [MAIN, ...args], cwd === undefined ? { encoding: 'utf8' } : { encoding: 'utf8', cwd });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

/** Exit 2, nothing on stdout, one stderr line matching `pattern`, and no stack trace, NaN or Infinity. */
export function expectOneLineError(result: CliRun, pattern: RegExp): void {
  expect(result.status).toBe(2);
  expect(result.stdout).toBe('');
  const lines = result.stderr.trimEnd().split('\n');
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(pattern);
  expect(result.stderr).not.toMatch(/\bat .*\.js:\d+|NaN|Infinity/);
}
