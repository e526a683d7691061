// What the commands that run the analysis (`spread`, `grades`, `design`) share on the command line: progress drawn
// on the terminal for the studies in src/design.
import type { ProgressFactory } from '../design/analysis-choice.js';
import { createProgress } from './progress.js';

/** Progress of a study's runs, drawn on stderr when it is a terminal (src/cli/progress.ts). */
export const progressToTerminal: ProgressFactory = (label) => createProgress({ label });
