// Starter design files written by `trimfree init`, one per kind of supply. Each is valid as written (a test checks
// it), uses "auto" wherever trimfree can pick, and explains each section in its notes. The figures are placeholders
// of our own, typical of the parts' class: replace them with your datasheets' numbers.
import type { DesignInput } from './schema.js';

export const STARTER_KINDS = ['charger', 'bench', 'led', 'voltage-only', 'current-only'] as const;
export type StarterKind = (typeof STARTER_KINDS)[number];

const COMMON_NOTES = [
  'Starter written by `trimfree init`: the figures are PLACEHOLDERS, replace each with your part datasheets\' values.',
  'Values take notation ("4K7", "12 V", "1%", "100ppm") or plain numbers in SI units (percent for tolerances, ppm/K for TCRs). `trimfree schema` prints the JSON Schema for editors.',
  'reference: the voltage the regulator holds its feedback pin at, and its tolerance.',
  'voltage: the output set-point: target, spec window, the feedback divider ("auto" picks standard values), feedback-pin bias current.',
  'current: the current limit: target, window, topology (direct, noninv, diff), shunt, amplifier offsets, threshold, gain resistors.',
  'current.shunt.parasitic { value, tolerance, tcr }: the pads and traces the amplifier sees in series with the shunt when it is not sensed with Kelvin (four-terminal) connections; a few mΩ matter beside a 10 mΩ shunt (common practice concern). Leave it out with Kelvin sensing.',
  'Bias currents: "20 nA" is exactly 20 nA, "±20 nA" or "10n±10n" a band, "0..20n" a range, "max 20 nA" anywhere in 0..20 nA.',
  'resistors: the default grade (10%, 5%, 2%, 1%, 0.5%, 0.25%, 0.1%, 0.05%, 0.02%, 0.01%), the grades `grades` compares (grades, default 5%, 1%, 0.5%, 0.1%), with per-designator overrides (RTOP, RBOT, RS, RF, RG, R1-R4, RT1, RT2).',
  'networks (optional): resistors bought as one network, e.g. { "RN1": { "members": ["R1", "R2", "R3", "R4"], "tolerance": "0.1%", "ratio": "0.05%", "tcr": "25ppm", "tracking": "5ppm" } }: the members share one draw and each has its own, so both the absolute and the ratio (matching) band hold; members take the network\'s figures, not the resistor grade.',
  'temperature: ambient range for TCRs and drifts. analysis: Monte Carlo trials ("auto" or a number) and seed. costs: relative cost per grade (defaults illustrative).',
  'Drift: analysis.condition "as-built" (default) counts tolerances only; "end-of-life" (or --condition end-of-life) adds reference.drift and each part\'s drift allowances { loadLife, dampHeat, soldering } (resistors.drift, per part in overrides, current.shunt.drift, voltage.pot.drift, current.threshold.drift); a resistor without them takes its grade\'s defaults, common practice: replace with your datasheet.',
  'Production spread: distribution per part (uniform, normal, triangular; "binned" with sortedOut for a grade sorted from wider production), reference.distribution, amplifier vosDistribution and biasDistribution; lots { count } (or spread --lots K) reports the worst lot\'s yield beside the overall.',
];

const TEMPLATES: Record<StarterKind, DesignInput> = {
  charger: {
    notes: [
      ...COMMON_NOTES,
      'CAUTION: a lithium cell\'s charge-voltage window comes from the cell datasheet. Check the worst-case maximum output against it and keep independent pack protection.',
      'A charge voltage must hold for the charger\'s whole life: check it with `trimfree spread FILE --condition end-of-life` too, with reference.drift and the resistors\' drift from your datasheets.',
    ],
    application: 'charger',
    reference: { voltage: '1.25 V', tolerance: '0.5%', notes: 'Charger references are usually 0.5 % or better; the CV window needs it.' },
    voltage: { target: '8.4 V', window: '±0.75%', divider: 'auto', feedbackBias: 'max 50 nA', notes: 'Two cells at 4.20 V each.' },
    current: {
      target: '1.5 A',
      window: '±10%',
      topology: 'noninv',
      shunt: { value: 'auto', rating: '1 W', tcr: '75ppm', thermalResistance: '60 K/W' },
      amplifier: { vos: '2 mV', vosDrift: '5 µV/K', biasCurrent: '±100 nA', rail: '5 V', headroom: '0.2 V' },
      compareOffset: '1 mV',
      threshold: { voltage: '1.0 V', tolerance: '1%' },
      gain: 'auto',
      notes: 'Low-side shunt into a non-inverting amplifier compared with a fixed 1.0 V threshold.',
    },
    resistors: { grade: '1%', overrides: { RTOP: { grade: '0.1%' }, RBOT: { grade: '0.1%' } } },
    temperature: { min: '0 °C', max: '45 °C' },
    analysis: { trials: 'auto', seed: 1 },
  },
  bench: {
    notes: [...COMMON_NOTES, 'Adjustable output: a pot in the top leg of the divider, chosen so every unit covers the target range.'],
    application: 'bench',
    reference: { voltage: '1.25 V', tolerance: '1%' },
    voltage: {
      target: '1.5..20 V',
      pot: { value: '10k', tolerance: '20%', leg: 'top', tcr: '100ppm', rating: '0.5 W' },
      divider: 'auto',
      search: { bottom: '200..2k' },
      feedbackBias: 'max 100 nA',
      notes: 'pot: tcr is the track\'s (cermet trimmers are often ±100 ppm/K); rating is the whole track\'s, derated by the share of track in circuit (common practice), so the track current must stay below √(rating/value) at every setting.',
    },
    current: {
      target: '3 A',
      window: '±10%',
      topology: 'noninv',
      shunt: { value: 'auto', rating: '2 W', tcr: '100ppm', thermalResistance: '40 K/W' },
      amplifier: { vos: '2 mV', biasCurrent: '±100 nA', rail: '5 V', headroom: '0.2 V' },
      threshold: { voltage: '1.2 V', tolerance: '1%' },
      gain: 'auto',
    },
    resistors: { grade: '1%' },
    temperature: { min: '10 °C', max: '40 °C' },
    analysis: { trials: 'auto', seed: 1 },
  },
  led: {
    notes: [...COMMON_NOTES, 'LED driver: the current loop sets the LED current; the voltage loop only clamps the output if the string opens. High-side sensing with a difference amplifier.', 'At high common mode the match of R1..R4 sets most of the limit error: four loose 0.1 % parts here, or one network with a ratio tolerance (see "networks" above; examples/led-driver-highside-network.json shows the difference).'],
    application: 'led',
    reference: { voltage: '0.8 V', tolerance: '1%' },
    voltage: { target: '24 V', window: '±4%', divider: 'auto', feedbackBias: 'max 50 nA' },
    current: {
      target: '700 mA',
      window: '±5%',
      topology: 'diff',
      commonMode: '17.5..20.5 V',
      shunt: { value: 'auto', rating: '0.5 W', tcr: '50ppm', thermalResistance: '80 K/W' },
      amplifier: { vos: '2 mV', biasCurrent: '±50 nA', offsetCurrent: '10 nA', cmrr: '80 dB', rail: '24 V', headroom: '0.5 V' },
      threshold: { voltage: '1.0 V', tolerance: '1%' },
      gain: 'auto',
      notes: [
        'The shunt sits between the supply and the LED string; commonMode is the string\'s anode voltage, given as the range it spreads over from unit to unit (the string\'s forward voltage varies), "19 V ±1.5 V" alike; commonModeDistribution says how it spreads (default uniform).',
        'amplifier: biasCurrent is the mean of the two input currents and offsetCurrent (Ios) their difference; cmrr is the amplifier\'s own datasheet minimum, which matters here because its inputs sit near the common-mode voltage.',
      ],
    },
    resistors: { grade: '1%', overrides: { R1: { grade: '0.1%' }, R2: { grade: '0.1%' }, R3: { grade: '0.1%' }, R4: { grade: '0.1%' } } },
    temperature: { min: '-20 °C', max: '60 °C' },
    analysis: { trials: 'auto', seed: 1 },
  },
  'voltage-only': {
    notes: [
      ...COMMON_NOTES,
      'Voltage-only design: a fixed-voltage regulator with no current loop of its own (its overcurrent protection is inside the regulator). There is no current section: leave it out rather than inventing one.',
    ],
    application: 'other',
    reference: { voltage: '0.6 V', tolerance: '1%' },
    voltage: { target: '3.3 V', window: '±3%', divider: 'auto', feedbackBias: 'max 50 nA', notes: 'A 3.3 V rail from a buck regulator with a 0.6 V feedback reference.' },
    resistors: { grade: '1%' },
    temperature: { min: '-20 °C', max: '70 °C' },
    analysis: { trials: 'auto', seed: 1 },
  },
  'current-only': {
    notes: [
      ...COMMON_NOTES,
      'Current-only design: a constant-current LED driver with no voltage loop (the string sets the output voltage). There is no voltage section and no reference: the threshold carries its own tolerance.',
      'CAUTION: without a voltage loop nothing clamps the output if the string opens; check the driver\'s open-load protection in its datasheet.',
    ],
    application: 'led',
    current: {
      target: '350 mA',
      window: '±5%',
      topology: 'noninv',
      shunt: { value: 'auto', rating: '0.25 W', tcr: '100ppm' },
      amplifier: { vos: '1 mV', biasCurrent: '±50 nA', rail: '5 V', headroom: '0.2 V' },
      threshold: { voltage: '0.5 V', tolerance: '1%' },
      gain: 'auto',
      notes: 'Low-side shunt under the LED string into a non-inverting amplifier compared with a fixed 0.5 V threshold.',
    },
    resistors: { grade: '1%' },
    temperature: { min: '-20 °C', max: '60 °C' },
    analysis: { trials: 'auto', seed: 1 },
  },
};

/** The starter design of a kind, as the JSON text `init` writes. */
export function starterText(kind: StarterKind): string {
  return `${JSON.stringify(TEMPLATES[kind], null, 2)}\n`;
}
