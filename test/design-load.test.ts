// The design file's loader: notation converted to SI, and every bad file answered with one InputError that names
// the field path, what was given and what is accepted. Expected SI values: the notation's definition (IEC 60062
// letter code 4K7 = 4.7 kΩ; 1 % = 0.01; 100 ppm/K = 1e-4 per kelvin).
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ImpossibleError, InputError, describeError } from '../src/errors.js';
import { loadDesignFile, parseDesignText, validateDesign } from '../src/design/load.js';
import { resolveDesign } from '../src/design/resolve.js';
import { baseDesign } from './design-fixture.js';

function errorOf(mutate: (d: Record<string, any>) => void): InputError {
  const design = baseDesign();
  mutate(design);
  try {
    validateDesign(design, 'test.json');
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  throw new Error('expected an InputError');
}

describe('design values in SI units', () => {
  it('converts notation and plain numbers', () => {
    const d = baseDesign();
    d.voltage.divider = { top: '4K7', bottom: 1000 };
    d.resistors = { tolerance: 0.5, tcr: 100, series: 'e96' };
    d.current.amplifier.biasCurrent = '50 nA';
    d.current.amplifier.vosDrift = '5 µV/K';
    d.current.shunt.thermalResistance = '60 °C/W';
    const design = validateDesign(d);
    expect(design.voltage!.divider).toEqual({ top: { parts: [4700], ohms: 4700 }, bottom: { parts: [1000], ohms: 1000 } });
    expect(design.reference!.voltage).toBe(1.25);
    expect(design.reference!.tolerance).toBeCloseTo(0.01, 15);
    expect(design.resistors.tolerance).toBeCloseTo(0.005, 15); // a bare number is percent
    expect(design.resistors.tcr).toBeCloseTo(1e-4, 15); // a bare number is ppm/K
    expect(design.resistors.series).toBe('E96');
    // A bare current is a typical value, taken as exactly that (src/units/current-band.ts).
    expect(design.current!.amplifier!.biasCurrent).toEqual({ nominal: 50e-9, lo: 50e-9, hi: 50e-9, form: 'typical' });
    expect(design.current!.amplifier!.vosDrift).toBeCloseTo(5e-6, 18);
    expect(design.current!.shunt.thermalResistance).toBe(60);
    expect(design.current!.shunt.value).toBeCloseTo(0.1, 15);
    expect(design.voltage!.target).toEqual([5, 5]);
    expect(design.voltage!.window).toEqual({ kind: 'relative', minus: 0.02, plus: 0.02 });
    expect(design.temperature).toEqual({ min: 0, max: 50 });
  });

  it('reads the bias-current forms: typical, ± band, range, maximum (src/units/current-band.ts)', () => {
    const forms: Array<[string | number, { nominal: number; lo: number; hi: number; form: string }]> = [
      ['20 nA', { nominal: 20e-9, lo: 20e-9, hi: 20e-9, form: 'typical' }],
      [2e-8, { nominal: 2e-8, lo: 2e-8, hi: 2e-8, form: 'typical' }],
      ['±20n', { nominal: 0, lo: -20e-9, hi: 20e-9, form: 'plus-minus' }],
      ['10n±10n', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'plus-minus' }],
      ['0..20n', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'range' }],
      ['max 20n', { nominal: 10e-9, lo: 0, hi: 20e-9, form: 'max' }],
    ];
    for (const [text, expected] of forms) {
      const d = baseDesign();
      d.voltage.feedbackBias = text;
      d.current.amplifier.biasCurrent = text;
      const design = validateDesign(d);
      for (const band of [design.voltage!.feedbackBias!, design.current!.amplifier!.biasCurrent!]) {
        expect(band.form).toBe(expected.form);
        expect(band.nominal).toBeCloseTo(expected.nominal, 24);
        expect(band.lo).toBeCloseTo(expected.lo, 24);
        expect(band.hi).toBeCloseTo(expected.hi, 24);
      }
    }
  });

  it('says what each bias current was taken to mean, and the engine gets that band', () => {
    const d = baseDesign();
    d.voltage.feedbackBias = 'max 50 nA';
    d.current.amplifier.biasCurrent = '20 nA';
    const r = resolveDesign(validateDesign(d));
    expect(r.notes).toContain('Feedback-pin bias current Ifb (voltage.feedbackBias): max 50.0 nA: uniform over 0..50.0 nA, nominal 25.0 nA.');
    expect(r.notes).toContain('Amplifier bias current Ib (current.amplifier.biasCurrent): 20.0 nA (a typical value, taken as exact).');
    // max 50 nA is 25 nA ± 25 nA; a typical 20 nA has no spread.
    expect(r.spec.divider!.feedbackBias!.nominal).toBeCloseTo(25e-9, 24);
    expect(r.spec.divider!.feedbackBias!.plusMinus).toBeCloseTo(25e-9, 24);
    const amp = r.spec.sense!.topology === 'noninv' ? r.spec.sense!.amplifier : undefined;
    expect(amp!.biasCurrent).toEqual({ nominal: 20e-9, plusMinus: 0 });
  });

  it('reads absolute and asymmetric windows, and "auto"', () => {
    const d = baseDesign();
    d.voltage.window = '4.9..5.1 V';
    d.current.window = '-5%/+10%';
    d.current.shunt.value = 'auto';
    d.current.gain = 'auto';
    const design = validateDesign(d);
    expect(design.voltage!.window).toEqual({ kind: 'absolute', lo: 4.9, hi: 5.1 });
    expect(design.current!.window).toEqual({ kind: 'relative', minus: 0.05, plus: 0.1 });
    expect(design.current!.shunt.value).toBe('auto');
    expect(design.current!.gain).toBe('auto');
  });
});

// Each bad file: the field path the error must name, and a pattern its one line must match.
const BAD: Array<[string, (d: Record<string, any>) => void, string, RegExp]> = [
  ['unknown field, with suggestion', (d) => (d.current.topolgy = 'noninv'), 'current.topolgy', /unknown field 'topolgy' \(did you mean 'topology'\?\).*accepted: the fields of current: target, window, topology/],
  ['unknown nested field', (d) => (d.voltage.divider = { top: '30k', botom: '10k' }), 'voltage.divider.botom', /did you mean 'bottom'/],
  ['unknown field in an override', (d) => (d.resistors.overrides = { RS: { tolerence: '1%' } }), 'resistors.overrides.RS.tolerence', /did you mean 'tolerance'/],
  ['unknown top-level field', (d) => (d.refrence = {}), 'refrence', /did you mean 'reference'/],
  ['unknown designator in overrides', (d) => (d.resistors.overrides = { RZ: { grade: '1%' } }), 'resistors.overrides.RZ', /no part 'RZ'.*did you mean 'RS'.*RTOP, RBOT, RS, RF, RG/],
  ['wrong type', (d) => (d.reference.voltage = true), 'reference.voltage', /wrong type: got boolean true; accepted: .*a voltage/],
  ['object expected', (d) => (d.current.shunt = '50m'), 'current.shunt', /wrong type: got text "50m"; accepted: an object with fields value, rating/],
  ['bad notation', (d) => (d.current.amplifier.vos = '2mX'), 'current.amplifier.vos', /unexpected character 'X' at position 3 in '2mX'; accepted: .*800mV/],
  ['bad resistance code', (d) => (d.voltage.divider.top = '4K7K'), 'voltage.divider.top', /4K7K.*accepted: .*4K7/],
  ['missing required field', (d) => delete d.reference.voltage, 'reference.voltage', /missing required field; accepted: .*voltage/],
  ['missing section', (d) => delete d.resistors, 'resistors', /missing required field/],
  // Single-loop designs (issue 11, section 5): either section may go, not both; a voltage section needs its reference.
  ['neither a voltage nor a current section', (d) => { delete d.voltage; delete d.current; }, 'voltage', /missing required field: the design has neither a voltage nor a current section; accepted: a voltage section \(output divider\), a current section \(current limit\), or both/],
  ['voltage section without its reference', (d) => delete d.reference, 'reference', /missing required field: the voltage section needs the reference.*; accepted: reference: \{ voltage/],
  ['current-only design overriding a divider part', (d) => { delete d.voltage; delete d.reference; d.resistors.overrides = { RTOP: { grade: '0.1%' } }; }, 'resistors.overrides.RTOP', /no part 'RTOP'.*RS, RF, RG/],
  ['voltage-only design overriding the shunt', (d) => { delete d.current; d.resistors.overrides = { RS: { grade: '0.1%' } }; }, 'resistors.overrides.RS', /no part 'RS'.*accepted: a designator of this design: RTOP, RBOT$/],
  ['window inverted', (d) => (d.voltage.window = '5.1..4.9'), 'voltage.window', /inverted/],
  ['window as a list, inverted', (d) => (d.voltage.window = [5.1, 4.9]), 'voltage.window', /inverted/],
  ['target outside the window', (d) => (d.voltage.window = '5.5..6'), 'voltage.window', /target 5 V lies outside the window/],
  ['enum with suggestion', (d) => (d.current.topology = 'nonin'), 'current.topology', /"nonin" is not one of the choices \(did you mean 'noninv'\?\); accepted: "direct", "noninv", "diff"/],
  ['near-miss of "auto"', (d) => (d.voltage.divider = 'atuo'), 'voltage.divider', /did you mean "auto"/],
  ['series name', (d) => (d.resistors.series = 'E97'), 'resistors.series', /unknown series 'E97'; accepted: E3, E6, E12, E24, E48, E96, E192/],
  ['grade not in the table', (d) => (d.resistors.grade = '3%'), 'resistors.grade', /"3%" is not one of the choices; accepted: "10%", "5%", "2%", "1%", "0.5%", "0.25%", "0.1%", "0.05%", "0.02%", "0.01%"/],
  ['no grade and no tolerance', (d) => (d.resistors = {}), 'resistors.grade', /give a grade or a tolerance/],
  ['negative resistance', (d) => (d.voltage.divider.top = -30000), 'voltage.divider.top', /greater than zero/],
  ['tolerance above 50 %', (d) => (d.reference.tolerance = '80%'), 'reference.tolerance', /out of range/],
  ['trials not positive', (d) => (d.analysis = { trials: 0 }), 'analysis.trials', /out of range/],
  ['temperature reversed', (d) => (d.temperature = { min: 60, max: -20 }), 'temperature.min', /above max/],
  ['gain resistor of another topology', (d) => (d.current.gain.r1 = '1k'), 'current.gain.r1', /does not belong to the noninv topology/],
  ['missing gain resistor', (d) => delete d.current.gain.ground, 'current.gain.ground', /missing required field/],
  ['direct with an amplifier', (d) => { d.current.topology = 'direct'; delete d.current.gain; }, 'current.amplifier', /no amplifier/],
  ['common mode on a low-side topology', (d) => (d.current.commonMode = '12 V'), 'current.commonMode', /diff topology only/],
  ['adjustable target without a pot', (d) => (d.voltage.target = '3..12 V'), 'voltage.pot', /needs a pot/],
  ['threshold divider without reference', (d) => (d.current.threshold = { tolerance: '1%', top: 'auto', bottom: 'auto' }), 'current.threshold.voltage', /missing required field/],
  ['feedback bias, inverted range', (d) => (d.voltage.feedbackBias = '50n..10n'), 'voltage.feedbackBias', /inverted.*; accepted: a current as a typical value \(20n: exactly 20 nA\), a ± band \(±20n, 0±20n, 10n±10n\), a range \(0\.\.20n\), or a maximum \(max 20n: anywhere in 0\.\.20 nA, uniform\)/],
  ['amplifier bias, bad notation', (d) => (d.current.amplifier.biasCurrent = '±50q'), 'current.amplifier.biasCurrent', /unexpected character 'q'.*; accepted: a current as a typical value/],
  ['amplifier bias, negative maximum', (d) => (d.current.amplifier.biasCurrent = 'max -1n'), 'current.amplifier.biasCurrent', /a maximum must not be negative/],
  ['amplifier bias, beyond any part', (d) => (d.current.amplifier.biasCurrent = '±1e6'), 'current.amplifier.biasCurrent', /out of range.*accepted: .*-10 kA to 10 kA/],
  ['notes of the wrong type', (d) => (d.notes = 5), 'notes', /wrong type/],
  // Two-resistor divider legs (src/design/divider-leg.ts): one line naming the leg and every accepted form.
  ['leg with a dangling joint', (d) => (d.voltage.divider.bottom = '6R8 + '), 'voltage.divider.bottom', /'6R8 \+ ' needs a resistance on each side.*; accepted: .*"6R8 \+ 2K2".*"10k ∥ 47k".*\{ "series": \["6R8", "2K2"\] \}/],
  ['leg of three resistors', (d) => (d.voltage.divider.top = '10k ∥ 47k ∥ 100k'), 'voltage.divider.top', /joins 3 resistors: a leg takes one resistor or two; accepted: .*"parallel"/],
  ['leg mixing series and parallel', (d) => (d.voltage.divider.top = '10k + 47k || 1k'), 'voltage.divider.top', /joins 3 resistors/],
  ['leg with a bad value', (d) => (d.voltage.divider.top = '10k + 4K7K'), 'voltage.divider.top', /4K7K.*; accepted: .*"6R8 \+ 2K2"/],
  ['structured leg of one value', (d) => (d.voltage.divider.bottom = { series: ['10k'] }), 'voltage.divider.bottom', /"series" lists 1 value: it takes exactly two resistors; accepted: .*\{ "parallel": \["10k", "47k"\] \}/],
  ['structured leg of three values', (d) => (d.voltage.divider.bottom = { parallel: ['10k', '47k', '1M'] }), 'voltage.divider.bottom', /"parallel" lists 3 values: it takes exactly two resistors/],
  ['structured leg both series and parallel', (d) => (d.voltage.divider.bottom = { series: ['1k', '2k'], parallel: ['1k', '2k'] }), 'voltage.divider.bottom', /either series or parallel/],
  ['structured leg, unknown key', (d) => (d.voltage.divider.bottom = { serie: ['1k', '2k'] }), 'voltage.divider.bottom.serie', /did you mean 'series'/],
  ['two-resistor leg with a pot', (d) => { d.voltage.target = '3..12 V'; d.voltage.pot = { value: '10k' }; delete d.voltage.window; d.voltage.divider.top = '1k + 2k'; }, 'voltage.divider.top', /two-resistor legs are not offered with a pot/],
  ['search.parts not 2 or 3', (d) => { d.voltage.divider = 'auto'; d.voltage.search = { parts: 4 }; }, 'voltage.search.parts', /accepted: .*2 \(default, one per leg\) or 3/],
  // Amplifier input errors (issue 11, section 5): offset current and the amplifier's own CMRR.
  ['offset current misspelt', (d) => (d.current.amplifier.ofsetCurrent = '5 nA'), 'current.amplifier.ofsetCurrent', /did you mean 'offsetCurrent'/],
  ['offset current negative', (d) => (d.current.amplifier.offsetCurrent = '-5 nA'), 'current.amplifier.offsetCurrent', /out of range.*; accepted: a current.*0 A or more/],
  ['cmrr on a low-side topology', (d) => (d.current.amplifier.cmrr = '80 dB'), 'current.amplifier.cmrr', /CMRR applies to the diff topology only.*; accepted: topology "diff", or no amplifier\.cmrr/],
  ['cmrr bad notation', (d) => (d.current.amplifier.cmrr = '80 dBV'), 'current.amplifier.cmrr', /unexpected character 'V' at position 6 in '80 dBV'; accepted: a ratio in decibels such as 90 dB/],
  ['cmrr zero', (d) => (d.current.amplifier.cmrr = 0), 'current.amplifier.cmrr', /out of range.*; accepted: a ratio in decibels.*above 0 dB, at most 200 dB/],
  ['shunt parasitic misspelt', (d) => (d.current.shunt.parasitc = { value: '2m', tolerance: '30%' }), 'current.shunt.parasitc', /did you mean 'parasitic'/],
  ['shunt parasitic without its tolerance', (d) => (d.current.shunt.parasitic = { value: '2m' }), 'current.shunt.parasitic.tolerance', /missing required field; accepted: its tolerance/],
  ['shunt parasitic, bad value', (d) => (d.current.shunt.parasitic = { value: '2mX', tolerance: '30%' }), 'current.shunt.parasitic.value', /unexpected character 'X'/],
  ['common mode range inverted', (d) => { d.current.topology = 'diff'; d.current.gain = { r1: '1k', r2: '9k', r3: '1k', r4: '9k' }; d.current.commonMode = '21..17 V'; }, 'current.commonMode', /inverted.*; accepted: a voltage \(19 V\), a range over which it spreads from unit to unit/],
  ['common mode band unreadable', (d) => { d.current.topology = 'diff'; d.current.gain = { r1: '1k', r2: '9k', r3: '1k', r4: '9k' }; d.current.commonMode = '19 V ±'; }, 'current.commonMode', /cannot read the band '19 V ±'.*; accepted: .*19 V ±2 V/],
  ['common mode distribution without a range', (d) => { d.current.topology = 'diff'; d.current.gain = { r1: '1k', r2: '9k', r3: '1k', r4: '9k' }; d.current.commonMode = '19 V'; d.current.commonModeDistribution = 'normal'; }, 'current.commonModeDistribution', /needs a commonMode range/],
  ['common mode distribution misspelt', (d) => (d.current.commonModeDistrib = 'normal'), 'current.commonModeDistrib', /did you mean 'commonModeDistribution'/],
  ['threshold tempco misspelt', (d) => (d.current.threshold.tempc = '50ppm'), 'current.threshold.tempc', /did you mean 'tempco'/],
  ['threshold without a tolerance', (d) => delete d.current.threshold.tolerance, 'current.threshold.tolerance', /missing required field; accepted: a percentage/],
  ['regulator threshold with its own tolerance', (d) => (d.current.threshold = { reference: 'regulator', tolerance: '1%', top: '1k', bottom: '4k' }), 'current.threshold.tolerance', /takes that reference's tolerance.*; accepted: no threshold\.tolerance with reference "regulator"/],
  ['regulator threshold in a current-only design', (d) => { delete d.voltage; delete d.reference; d.current.threshold = { reference: 'regulator', top: '1k', bottom: '4k' }; }, 'current.threshold.reference', /fed from the regulator reference, but the design has no reference section/],
  ['regulator threshold above the reference', (d) => { d.current.gain = 'auto'; d.current.threshold = { reference: 'regulator', voltage: '2 V', top: 'auto', bottom: 'auto' }; }, 'current.threshold.voltage', /not below the regulator reference 1\.25 V/],
  ['pot rating misspelt', (d) => { d.voltage.target = '3..12 V'; delete d.voltage.window; d.voltage.pot = { value: '10k', ratng: '0.25 W' }; }, 'voltage.pot.ratng', /did you mean 'rating'/],
  ['pot rating zero', (d) => { d.voltage.target = '3..12 V'; delete d.voltage.window; d.voltage.pot = { value: '10k', rating: 0 }; }, 'voltage.pot.rating', /power must be greater than zero.*; accepted: .*250mW/],
  ['pot tcr bad notation', (d) => { d.voltage.target = '3..12 V'; delete d.voltage.window; d.voltage.pot = { value: '10k', tcr: '100ppX' }; }, 'voltage.pot.tcr', /unexpected character/],
  ['override of a leg part the design does not place', (d) => (d.resistors.overrides = { RTOP_A: { grade: '0.1%' } }), 'resistors.overrides.RTOP_A', /no part 'RTOP_A'/],
  // Resistor networks (src/design/network-field.ts).
  ['network field typo', (d) => (d.networks = { RN1: { members: ['RF', 'RG'], tolerance: '0.1%', ratoi: '0.05%' } }), 'networks.RN1.ratoi', /did you mean 'ratio'/],
  ['network member not placed', (d) => (d.networks = { RN1: { members: ['RF', 'RGG'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RN1.members[1]', /no part 'RGG' in this design \(did you mean 'RG'\?\); accepted: a resistor of this design: RTOP, RBOT, RF, RG/],
  ['network ratio wider than its tolerance', (d) => (d.networks = { RN1: { members: ['RF', 'RG'], tolerance: '0.1%', ratio: '0.2%' } }), 'networks.RN1.ratio', /ratio tolerance 0.2 % is wider than the absolute tolerance 0.1 %; got "0.2%"; accepted: a ratio tolerance at most the absolute tolerance/],
  ['network tracking past twice its TCR', (d) => (d.networks = { RN1: { members: ['RF', 'RG'], tolerance: '0.1%', ratio: '0.05%', tcr: '10ppm', tracking: '25ppm' } }), 'networks.RN1.tracking', /more than twice the 10 ppm\/K TCR/],
  ['network of one member', (d) => (d.networks = { RN1: { members: ['RF'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RN1.members', /too small|at least|>=2/i],
  ['network member listed twice', (d) => (d.networks = { RN1: { members: ['RF', 'RF'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RN1.members[1]', /'RF' is listed twice/],
  ['the shunt in a network', (d) => (d.networks = { RN1: { members: ['RS', 'RG'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RN1.members[0]', /the shunt RS cannot be a network member/],
  ['a resistor in two networks', (d) => (d.networks = { RN1: { members: ['RF', 'RG'], tolerance: '0.1%', ratio: '0.05%' }, RN2: { members: ['RG', 'RTOP'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RN2.members[0]', /RG is already a member of RN1/],
  ['an override of a network member', (d) => { d.networks = { RN1: { members: ['RF', 'RG'], tolerance: '0.1%', ratio: '0.05%' } }; d.resistors.overrides = { RG: { grade: '0.1%' } }; }, 'resistors.overrides.RG', /RG is a member of the network RN1, whose tolerance and TCR it takes/],
  ['a network named like a part', (d) => (d.networks = { RF: { members: ['RTOP', 'RBOT'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RF', /has the name of a part of this design/],
  ['a network name that is not a designator', (d) => (d.networks = { 'RN 1': { members: ['RTOP', 'RBOT'], tolerance: '0.1%', ratio: '0.05%' } }), 'networks.RN 1', /is not a designator/],
  ['a two-resistor leg named as a member', (d) => { d.voltage.divider.top = '10k + 20k'; d.networks = { RN1: { members: ['RTOP', 'RBOT'], tolerance: '0.1%', ratio: '0.05%' } }; }, 'networks.RN1.members[0]', /RTOP is a two-resistor leg here; got "RTOP"; accepted: its parts RTOP_A and RTOP_B/],
];

describe('bad design files name the field path', () => {
  for (const [label, mutate, path, pattern] of BAD) {
    it(label, () => {
      const error = errorOf(mutate);
      expect(error.where).toBe(path);
      const line = describeError(error);
      expect(line).toMatch(pattern);
      expect(line).not.toMatch(/\n|NaN|Infinity|undefined/);
    });
  }
});

describe('files and JSON', () => {
  const dir = mkdtempSync(join(tmpdir(), 'trimfree-design-'));
  it('a missing file', () => {
    expect(() => loadDesignFile(join(dir, 'none.json'))).toThrow(/no such file/);
  });
  it('a folder', () => {
    try {
      loadDesignFile(dir);
      throw new Error('expected an error');
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).message).toMatch(/folder/);
    }
  });
  it('bad JSON gives line and column (counted by hand from the text)', () => {
    // Line 3 is `  "voltage" "1"`: the colon is missing after the name, which ends at column 12.
    const text = '{\n "reference": {\n  "voltage" "1"\n }\n}';
    try {
      parseDesignText(text, 'f.json');
      throw new Error('expected an error');
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).where).toBe('f.json:3:13');
      expect((error as InputError).message).toMatch(/not valid JSON/);
    }
    expect(() => parseDesignText('{"a": 1,}', 'g.json')).toThrow(InputError);
    try {
      parseDesignText('', 'e.json');
    } catch (error) {
      expect((error as InputError).message).toMatch(/ends too early/);
    }
  });
  it('a JSON list instead of an object', () => {
    const path = join(dir, 'list.json');
    writeFileSync(path, '[1, 2]');
    try {
      loadDesignFile(path);
      throw new Error('expected an error');
    } catch (error) {
      expect(describeError(error as InputError)).toMatch(/wrong type: got a list; accepted: an object with fields \$schema, notes, application, reference/);
    }
  });
  it('a byte-order mark is accepted', () => {
    const path = join(dir, 'bom.json');
    writeFileSync(path, `\uFEFF${JSON.stringify(baseDesign())}`);
    expect(loadDesignFile(path).reference!.voltage).toBe(1.25);
  });
  it('ImpossibleError is not used for malformed input', () => {
    expect(errorOf((d) => (d.reference.voltage = 'x'))).not.toBeInstanceOf(ImpossibleError);
  });
});

describe('random and mutated design files (property test)', () => {
  /** Every path to a leaf or object in a JSON value. */
  function paths(value: unknown, prefix: string[] = []): string[][] {
    if (value === null || typeof value !== 'object') return [prefix];
    const out: string[][] = [prefix];
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) out.push(...paths(v, [...prefix, k]));
    return out;
  }
  const allPaths = paths(baseDesign()).filter((p) => p.length > 0);
  const junk = fc.oneof(
    fc.string({ maxLength: 12 }),
    fc.double(),
    fc.integer(),
    fc.boolean(),
    fc.constant(null),
    fc.constantFrom('auto', '4K7', '-1%', '1e999', '±', '..', 'NaN', 'Infinity', '0', '1..', '5..1', [], {}, [1, 2, 3], { x: 1 }),
  );

  it('never crash: each mutation either validates or gives one InputError line with a field path', () => {
    fc.assert(
      fc.property(fc.constantFrom(...allPaths), junk, fc.boolean(), (path, value, remove) => {
        const design = baseDesign();
        let here: Record<string, any> = design;
        for (const key of path.slice(0, -1)) here = here[key];
        if (remove) delete here[path.at(-1)!];
        else here[path.at(-1)!] = value;
        try {
          const parsed = validateDesign(design, 'prop.json');
          const numbers: number[] = [];
          JSON.stringify(parsed, (_k, v: unknown) => {
            if (typeof v === 'number') numbers.push(v);
            return v;
          });
          expect(numbers.every(Number.isFinite)).toBe(true);
          // A design that validates resolves, or is explained as impossible; never a crash.
          try {
            const resolved = resolveDesign(parsed);
            expect(resolved.bom.every((l) => Number.isFinite(l.powerW) && Number.isFinite(l.ohms))).toBe(true);
          } catch (error) {
            expect(error instanceof InputError || error instanceof ImpossibleError).toBe(true);
          }
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
          const line = describeError(error as InputError);
          expect(line).not.toMatch(/\n/);
          // The given value is echoed in quotes; outside them no NaN, Infinity or undefined may appear.
          const unquoted = line.replace(/"[^"]*"|'[^']*'/g, '');
          expect(unquoted).not.toMatch(/NaN|undefined|\[object Object\]/);
          expect((error as InputError).where.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it('unknown fields anywhere are refused, with the path of the field', () => {
    fc.assert(
      fc.property(fc.constantFrom(...paths(baseDesign()).filter((p) => { let v: any = baseDesign(); for (const k of p) v = v[k]; return v !== null && typeof v === 'object' && !Array.isArray(v) && p.at(-1) !== 'overrides'; })), fc.stringMatching(/^[a-z]{3,10}$/), (path, name) => {
        const design = baseDesign();
        let here: Record<string, any> = design;
        for (const key of path) here = here[key];
        if (name in here) return;
        here[name] = 1;
        try {
          validateDesign(design);
        } catch (error) {
          expect((error as InputError).where).toBe([...path, name].join('.'));
          return;
        }
        throw new Error(`unknown field ${[...path, name].join('.')} was accepted`);
      }),
      { numRuns: 300 },
    );
  });
});
