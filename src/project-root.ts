// Finds the package's own folder (where package.json and series/ live), from source or from the build in dist/.
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

function findRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (existsSync(join(dir, 'package.json')) && existsSync(join(dir, 'series'))) return dir;
    const parent = dirname(dir);
    if (parent === dir) throw new Error('cannot find the trimfree package folder (package.json beside series/)');
    dir = parent;
  }
}

export const PROJECT_ROOT: string = findRoot();
