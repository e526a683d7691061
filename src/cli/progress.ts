// Progress for long runs, drawn on stderr only when it is a terminal, and only once a run has taken more than
// about a second (short runs stay silent). Never written to stdout, so --json output stays clean.

export interface ProgressStream {
  isTTY?: boolean;
  write(text: string): boolean;
}

export interface Progress {
  /** Pass as the engine's onProgress callback: trials done so far out of the total (total may grow for 'auto'). */
  update(done: number, total: number): void;
  /** Clears the progress line (call when the run ends, also on failure). */
  finish(): void;
}

export interface ProgressOptions {
  label: string;
  stream?: ProgressStream;
  /** Milliseconds before anything is drawn (default 1000). */
  delayMs?: number;
  /** Clock in milliseconds (injectable for tests). */
  now?: () => number;
}

const SILENT: Progress = { update: () => undefined, finish: () => undefined };

export function createProgress(options: ProgressOptions): Progress {
  const stream = options.stream ?? process.stderr;
  if (!stream.isTTY) return SILENT;
  const now = options.now ?? (() => performance.now());
  const delayMs = options.delayMs ?? 1000;
  const started = now();
  let lastDrawn = -Infinity;
  let drawn = false;
  return {
    update(done, total) {
      const t = now();
      if (t - started < delayMs || t - lastDrawn < 100) return;
      lastDrawn = t;
      drawn = true;
      const fraction = total > 0 ? Math.min(1, done / total) : 0;
      const width = 24;
      const filled = Math.round(fraction * width);
      const bar = '#'.repeat(filled) + '.'.repeat(width - filled);
      stream.write(`\r${options.label} [${bar}] ${(fraction * 100).toFixed(0).padStart(3)} %  ${done.toLocaleString('en-US')} trials`);
    },
    finish() {
      if (drawn) stream.write('\r\x1b[2K');
      drawn = false;
    },
  };
}
