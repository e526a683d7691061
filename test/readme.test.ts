// The README's command examples are run, and what it shows must be what the tool prints (docs must not drift).
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../src/project-root.js';

const CLI = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');

interface Example {
  args: string[];
  shown: string[];
}

/** Every fenced block that starts with `$ trimfree …`: the command and the output lines shown under it. */
function readmeExamples(): Example[] {
  const text = readFileSync(join(PROJECT_ROOT, 'README.md'), 'utf8');
  const examples: Example[] = [];
  for (const block of text.split('```').filter((_, i) => i % 2 === 1)) {
    const lines = block.replace(/^\n/, '').split('\n').filter((line, i, all) => i < all.length - 1 || line !== '');
    const first = lines[0] ?? '';
    if (!first.startsWith('$ trimfree ')) continue;
    examples.push({ args: first.slice('$ trimfree '.length).split(/\s+/), shown: lines.slice(1) });
  }
  return examples;
}

beforeAll(() => {
  if (!existsSync(CLI)) execFileSync('npx', ['tsc', '-p', PROJECT_ROOT], { cwd: PROJECT_ROOT });
});

describe('README examples', () => {
  const examples = readmeExamples();
  it('the README has command examples to check', () => {
    expect(examples.length).toBeGreaterThanOrEqual(6);
  });
  for (const example of examples) {
    it(`trimfree ${example.args.join(' ')} prints what the README shows`, () => {
      const output = execFileSync('node', [CLI, ...example.args], { cwd: PROJECT_ROOT, encoding: 'utf8' });
      const printed = output.split('\n').slice(0, example.shown.length);
      expect(printed).toEqual(example.shown);
    }, 60_000);
  }
});
