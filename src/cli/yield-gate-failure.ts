// The error a run ends with when the --fail-under-yield gate fails (exit code 1). Its own small module so that
// run.ts recognises it at every start without loading what builds its message (src/cli/yield-gate.ts).

/** Exit code of a run whose output is complete but whose yield is below --fail-under-yield. */
export const EXIT_YIELD_GATE = 1;

/** One output's yield as the report shows it. */
export interface GatedYield {
  /** e.g. "vout", or "all specs at 1 %" for grades. */
  name: string;
  pct: number;
}

/** Raised after the report is written: main.ts prints its message and exits 1. */
export class YieldGateFailure extends Error {
  readonly failing: GatedYield[];
  constructor(message: string, failing: GatedYield[]) {
    super(message);
    this.name = 'YieldGateFailure';
    this.failing = failing;
  }
}
