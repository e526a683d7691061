// A small valid design file with explicit values, for the design tests to mutate (invented figures).
/** A small valid design with explicit values (noninv current sense). */
export function baseDesign(): Record<string, any> {
  return {
    notes: 'test design (invented)',
    reference: { voltage: '1.25 V', tolerance: '1%' },
    voltage: { target: '5 V', window: '±2%', divider: { top: '30k', bottom: '10k' } },
    current: {
      target: '1 A',
      window: '±10%',
      topology: 'noninv',
      shunt: { value: 'R10', rating: '1 W' },
      amplifier: { vos: '1 mV', rail: '5 V' },
      threshold: { voltage: '1.0 V', tolerance: '1%' },
      gain: { feedback: '9k', ground: '1k' },
    },
    resistors: { grade: '1%' },
    temperature: { min: 0, max: 50 },
  };
}

