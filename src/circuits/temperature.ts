// A resistance at temperature: R(T) = R25·(1 + α·(T − 25 °C)), α the temperature coefficient (TCR) in 1/K.
// First-order (linear) TCR model as resistor datasheets specify it, referred to 25 °C: common practice.

export const REFERENCE_TEMPERATURE_C = 25;

export function resistanceAt(r25: number, tcrPerK: number, temperatureC: number): number {
  return r25 * (1 + tcrPerK * (temperatureC - REFERENCE_TEMPERATURE_C));
}

/** Temperature rise of a part dissipating `powerW` with thermal resistance θ (K/W) to ambient: ΔT = θ·P. */
export function selfHeatingRise(thermalResistanceKPerW: number, powerW: number): number {
  return thermalResistanceKPerW * powerW;
}
