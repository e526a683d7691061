// The benchmark's design: an invented CV/CC bench-supply module (examples/engine/bench-supply.json says so), in the
// engine's resolved form. Invented data lives in examples/; this file only loads it.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { SupplySpec } from '../analysis/models/supply.js';
import { PROJECT_ROOT } from '../project-root.js';

const document = JSON.parse(readFileSync(join(PROJECT_ROOT, 'examples', 'engine', 'bench-supply.json'), 'utf8')) as {
  spec: SupplySpec;
};

export const BENCH_SUPPLY: SupplySpec = document.spec;
