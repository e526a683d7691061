import { describe, expect, it } from 'vitest';
import { outputJson, spreadJson, stringifyReport } from '../src/report/json.js';
import { FIXTURE_RESULT } from './report-fixture.js';

describe('spread JSON', () => {
  const json = spreadJson(FIXTURE_RESULT, { version: '1.2.3', cautions: ['check the datasheet'] });

  it('has the documented shape: seed, trials, version, outputs with the listed figures copied from the result', () => {
    expect(json).toMatchObject({ seed: 'fixture', trials: 100000, version: '1.2.3', cautions: ['check the datasheet'] });
    const v = json.outputs.vout;
    const r = FIXTURE_RESULT.outputs.vout;
    expect(v).toMatchObject({
      nominal: r.nominal,
      mean: r.mean,
      sigma: r.sigma,
      interval95: r.interval95,
      worstCase: { min: r.worstCase.min, max: r.worstCase.max },
      rss: { sigma: r.rss.sigma, expandedUncertainty: r.rss.expandedUncertainty, coverageFactor: 2 },
      yieldPct: r.yield!.pct,
      cpk: r.cpk,
    });
    expect(v.contributions.map((c) => c.part)).toEqual(['Vref', 'R1', 'R2 <bottom>']);
  });

  it('leaves out the worker count, so the JSON is the same for any number of workers', () => {
    const other = spreadJson({ ...FIXTURE_RESULT, workers: 7 }, { version: '1.2.3', cautions: ['check the datasheet'] });
    expect(stringifyReport(other)).toBe(stringifyReport(json));
  });

  it('an output without a spec window has null yield, ppm, Cp and Cpk, each with a note', () => {
    const s = json.outputs.shuntLoss;
    expect([s.spec, s.yieldPct, s.ppmOut, s.cp, s.cpk]).toEqual([null, null, null, null, null]);
    expect(s.notes.join(' ')).toMatch(/cpk: no spec window/);
  });

  it('a spec window with zero spread: Cpk null with the reason, not Infinity', () => {
    const flat = { ...FIXTURE_RESULT.outputs.vout, sigma: 0, cp: Infinity, cpk: Infinity };
    const o = outputJson(flat);
    expect(o.cpk).toBeNull();
    expect(o.notes.join(' ')).toMatch(/σ is zero/);
  });

  it('a non-finite figure the engine must always give is an error, never printed', () => {
    expect(() => outputJson({ ...FIXTURE_RESULT.outputs.vout, mean: NaN })).toThrow(/mean is not a finite number/);
    expect(() => stringifyReport({ a: { b: Infinity } })).toThrow(/not a finite number/);
  });

  it('the serialised text contains no NaN, Infinity or undefined and parses back', () => {
    const text = stringifyReport(json);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
    expect(JSON.parse(text)).toEqual(json);
  });
});
