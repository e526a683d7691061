import { describe, expect, it } from 'vitest';
import { createProgress } from '../src/cli/progress.js';

function fakeStream(isTTY: boolean) {
  const written: string[] = [];
  return { stream: { isTTY, write: (t: string) => (written.push(t), true) }, written };
}

describe('progress line', () => {
  it('stays silent when stderr is not a terminal', () => {
    const { stream, written } = fakeStream(false);
    const p = createProgress({ label: 'spread', stream, now: () => 5000 });
    p.update(10, 100);
    p.finish();
    expect(written).toEqual([]);
  });

  it('on a terminal: nothing during the first second, then a bar with the percentage, cleared at the end', () => {
    const { stream, written } = fakeStream(true);
    let t = 0;
    const p = createProgress({ label: 'spread', stream, now: () => t });
    t = 500;
    p.update(10, 100);
    expect(written).toEqual([]);
    t = 1200;
    p.update(50, 200);
    expect(written).toHaveLength(1);
    expect(written[0]).toMatch(/^\rspread \[#{6}\.{18}\]  25 % {2}50 trials$/);
    t = 1250; // less than 100 ms later: not redrawn
    p.update(60, 200);
    expect(written).toHaveLength(1);
    p.finish();
    expect(written[1]).toBe('\r\x1b[2K');
  });
});
