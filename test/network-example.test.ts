// The bundled high-side LED driver (examples/led-driver-highside.json, invented) against the same driver with R1..R4
// bought as one network (examples/led-driver-highside-network.json, invented): the limit's spread narrows, and R1..R4's
// share of the worst case narrows by what the first-order form of the difference amplifier predicts.
import { describe, expect, it } from 'vitest';
import { nominalOutputs } from '../src/analysis/model.js';
import { buildSupplyModel, type SupplySpec } from '../src/analysis/models/supply.js';
import { worstCase } from '../src/analysis/worst-case.js';
import { readFileSync } from 'node:fs';
import { InputError } from '../src/errors.js';
import { loadDesignFile, validateDesign } from '../src/design/load.js';
import { baseDesign } from './design-fixture.js';
import { resolveDesign } from '../src/design/resolve.js';
import { runSpread } from '../src/design/spread-study.js';
import { networkBands } from '../src/tolerance/network-bands.js';

const before = resolveDesign(loadDesignFile('examples/led-driver-highside.json'));
const after = resolveDesign(loadDesignFile('examples/led-driver-highside-network.json'));

/** The spec with every part but R1..R4 exact (the other parts' spread is the same in both files). */
function onlyGainResistors(spec: SupplySpec): SupplySpec {
  const s = structuredClone(spec);
  const sense = s.sense!;
  if (sense.topology !== 'diff') throw new Error('the LED example is a diff topology');
  s.reference!.tolerance = 0;
  delete s.reference!.tempcoPerK;
  for (const leg of [s.divider!.top, s.divider!.bottom]) for (const r of leg.resistors) r.tolerance = 0;
  delete s.divider!.feedbackBias;
  sense.shunt.tolerance = 0;
  delete sense.shunt.tcrPerK;
  if (sense.threshold.kind !== 'divided' || sense.threshold.source === 'regulator-reference') throw new Error('the LED example divides its threshold from its own reference');
  sense.threshold.source.tolerance = 0;
  sense.threshold.top.tolerance = 0;
  sense.threshold.bottom.tolerance = 0;
  delete sense.threshold.top.tcrPerK;
  delete sense.threshold.bottom.tcrPerK;
  sense.amplifier.offsetMax = 0;
  delete sense.amplifier.offsetDriftPerK;
  delete sense.amplifier.biasCurrent;
  delete sense.compareOffset;
  return s;
}

describe('LED driver: R1..R4 as a 0.05 % ratio network', () => {
  it('the two files place the same values; only how R1..R4 are bought differs', () => {
    const codes = (r: typeof before) => r.bom.map((l) => `${l.designator} ${l.code}`);
    expect(codes(after)).toEqual(codes(before));
    expect(before.spec.networks).toBeUndefined();
    expect(after.spec.networks).toEqual([{ name: 'RN1', members: ['R1', 'R2', 'R3', 'R4'], tolerance: 0.001, ratio: 0.0005, tcrPerK: 25e-6, trackingPerK: 5e-6 }]);
    // Loose, each of R1..R4 is 0.1 % with 25 ppm/K: the network's absolute figures.
    const sense = before.spec.sense!;
    if (sense.topology !== 'diff') throw new Error('diff expected');
    expect([sense.r1, sense.r2, sense.r3, sense.r4].map((r) => [r.tolerance, r.tcrPerK])).toEqual(Array(4).fill([0.001, 25e-6]));
  });

  it("R1..R4's worst-case share of the limit narrows as the first-order form predicts", () => {
    // First order (derived in test/network-model.test.ts): with each member's relative deviation within ±b,
    //   worst |ΔI|/I0 = 2b·(|k − G| + |k + 1|)/(1 + G),   k = G·Vcm/Vth,
    // where a member's deviation at temperature is its value's plus α·ΔT. Loose parts: b = t + T·|ΔT|, every member
    // on its own. Network: the shared terms s and a cancel in every ratio, leaving b = μ + (τ/2)·|ΔT| with
    // μ = ρ/(2 + ρ). The largest |ΔT| of -20..60 °C is 45 K. The limit moves by up to about 13 % here, so the
    // neglected second-order terms are below 1e-3 relative here (measured: 2e-6 loose, 3e-4 network, 6e-5 for the narrowing); 5e-4 is allowed.
    const loose = onlyGainResistors(before.spec);
    const network = onlyGainResistors(after.spec);
    const sense = loose.sense!;
    if (sense.topology !== 'diff' || sense.threshold.kind !== 'divided' || sense.threshold.source === 'regulator-reference') throw new Error('diff expected');
    const G = sense.r2.nominal / sense.r1.nominal;
    const vth = (sense.threshold.source.nominal * sense.threshold.bottom.nominal) / (sense.threshold.top.nominal + sense.threshold.bottom.nominal);
    const k = (G * sense.commonModeV) / vth;
    const shape = (2 * (Math.abs(k - G) + Math.abs(k + 1))) / (1 + G);
    const dT = 45;
    const bLoose = 0.001 + 25e-6 * dT;
    const bands = networkBands({ tolerance: 0.001, ratio: 0.0005, tcrPerK: 25e-6, trackingPerK: 5e-6 });
    const bNetwork = bands.mismatch + bands.memberTcrPerK * dT;

    const halfSpread = (spec: SupplySpec): number => {
      const model = buildSupplyModel(spec);
      const w = worstCase(model).find((o) => o.name === 'ilimit')!;
      expect(w.method).toBe('enumeration');
      return (w.max - w.min) / 2 / nominalOutputs(model)['ilimit']!;
    };
    const wcLoose = halfSpread(loose);
    const wcNetwork = halfSpread(network);
    expect(wcLoose / (shape * bLoose)).toBeCloseTo(1, 3);
    expect(wcNetwork / (shape * bNetwork)).toBeCloseTo(1, 3);
    expect((wcLoose - wcNetwork) / (shape * (bLoose - bNetwork))).toBeCloseTo(1, 3);
  });

  it('the whole design: the limit spread before and after (worst case, Monte Carlo σ, yield)', async () => {
    // Monte Carlo of 2e5 trials each (the examples' own count and seed). The figures the README quotes.
    const [b, a] = await Promise.all([runSpread(before, { trials: 200_000, seed: 1, workers: 1, progress: false }), runSpread(after, { trials: 200_000, seed: 1, workers: 1, progress: false })]);
    const ib = b.result.outputs['ilimit']!;
    const ia = a.result.outputs['ilimit']!;
    expect(ia.sigma).toBeLessThan(0.6 * ib.sigma);
    expect(ia.worstCase.max - ia.worstCase.min).toBeLessThan(0.5 * (ib.worstCase.max - ib.worstCase.min));
    expect(ib.yield!.pct).toBeLessThan(95);
    expect(ia.yield!.pct).toBeGreaterThan(99.9);
  });
});

describe('networks in the design file, resolved', () => {
  it('an "auto" gain with R1..R4 in a network: the picker ranks by the network\'s quick worst case', () => {
    const raw = JSON.parse(readFileSync('examples/led-driver-highside.json', 'utf8'));
    delete raw.resistors.overrides;
    raw.networks = { RN1: { members: ['R1', 'R2', 'R3', 'R4'], tolerance: '0.1%', ratio: '0.05%', tcr: '25ppm', tracking: '5ppm' } };
    const withNetwork = resolveDesign(validateDesign(raw));
    const note = (r: typeof before) => r.notes.find((n) => n.startsWith('Current sense picked'))!;
    // The loose file's quick worst case and the network's, both from the picker's note (A).
    const quick = (text: string): number[] => [...text.matchAll(/quick worst case ([\d.]+) mA\.\.([\d.]+) mA/g)][0]!.slice(1, 3).map(Number);
    const [looseLo, looseHi] = quick(note(before));
    const [netLo, netHi] = quick(note(withNetwork));
    expect(netHi! - netLo!).toBeLessThan(0.6 * (looseHi! - looseLo!));
    // The members carry the network's figures into the engine and the BOM.
    expect(withNetwork.spec.networks?.[0]?.members).toEqual(['R1', 'R2', 'R3', 'R4']);
    expect(withNetwork.bom.filter((l) => l.network === 'RN1').map((l) => l.designator)).toEqual(['R1', 'R2', 'R3', 'R4']);
  });

  it('a member that an "auto" three-part divider turned into a two-resistor leg is refused at resolve, naming the field', () => {
    // With search.parts 3 the leg structure is known only once the picker has run: 5.03 V from 1.25 V comes out as
    // RTOP_A + RTOP_B over one RBOT, 5 V as one resistor a leg (30k/10k exactly).
    const design = (target: string, members: string[]) => {
      const d = baseDesign();
      d.voltage.divider = 'auto';
      d.voltage.search = { parts: 3, bottom: '1k..10k' };
      d.voltage.target = target;
      d.networks = { RN1: { members, tolerance: '0.1%', ratio: '0.05%' } };
      return validateDesign(d);
    };
    expect(() => resolveDesign(design('5.03 V', ['RTOP', 'RBOT']))).toThrow(InputError);
    try {
      resolveDesign(design('5.03 V', ['RTOP', 'RBOT']));
    } catch (e) {
      expect((e as InputError).where).toBe('networks.RN1.members[0]');
      expect((e as InputError).accepted).toMatch(/RTOP_A, RTOP_B, RBOT/);
    }
    expect(resolveDesign(design('5.03 V', ['RTOP_A', 'RTOP_B', 'RBOT'])).spec.networks?.[0]?.members).toEqual(['RTOP_A', 'RTOP_B', 'RBOT']);
    expect(() => resolveDesign(design('5 V', ['RTOP_A', 'RBOT']))).toThrow(/no single resistor RTOP_A/);
  });

  it('no TCR on the network: the grade\'s, said in the notes; no tracking: independent TCRs, said too', () => {
    const d = baseDesign();
    d.networks = { RN1: { members: ['RF', 'RG'], tolerance: '0.1%', ratio: '0.05%' } };
    const r = resolveDesign(validateDesign(d));
    expect(r.spec.networks).toEqual([{ name: 'RN1', members: ['RF', 'RG'], tolerance: 0.001, ratio: 0.0005, tcrPerK: 100e-6, trackingPerK: 200e-6 }]);
    expect(r.notes.join('\n')).toMatch(/RN1: no TCR given, ±100 ppm\/K taken from the resistor grade/);
    expect(r.notes.join('\n')).toMatch(/RN1: no TCR tracking given, so the members' TCRs are taken as independent/);
  });
});
