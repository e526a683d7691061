// Every supply spec the examples give, for tests that run each example through the engine: design files resolved
// (both ends of a pot), engine files as they are.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { SupplySpec } from '../src/analysis/models/supply.js';
import { loadDesignFile } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { PROJECT_ROOT } from '../src/project-root.js';

export function exampleSpecs(): Array<{ name: string; spec: SupplySpec }> {
  const specs: Array<{ name: string; spec: SupplySpec }> = [];
  for (const file of readdirSync(join(PROJECT_ROOT, 'examples')).filter((f) => f.endsWith('.json')).sort()) {
    const resolved = resolveDesign(loadDesignFile(join(PROJECT_ROOT, 'examples', file)));
    specs.push({ name: file, spec: resolved.spec });
    if (resolved.lowEnd) specs.push({ name: `${file} (low end)`, spec: resolved.lowEnd });
  }
  for (const file of readdirSync(join(PROJECT_ROOT, 'examples', 'engine')).filter((f) => f.endsWith('.json')).sort()) {
    specs.push({ name: `engine/${file}`, spec: (JSON.parse(readFileSync(join(PROJECT_ROOT, 'examples', 'engine', file), 'utf8')) as { spec: SupplySpec }).spec });
  }
  return specs;
}
