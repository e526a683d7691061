// Process capability indices (NIST/SEMATECH e-Handbook of Statistical Methods, 6.1.6):
//   Cp = (USL − LSL)/(6σ),   Cpk = min(USL − μ, μ − LSL)/(3σ).

export function processCapability(lsl: number, usl: number, mean: number, sigma: number): { cp: number; cpk: number } | null {
  if (!(sigma > 0) || !Number.isFinite(sigma)) return null;
  return { cp: (usl - lsl) / (6 * sigma), cpk: Math.min(usl - mean, mean - lsl) / (3 * sigma) };
}

/**
 * One-sided capability when the window has only one limit of its own (NIST/SEMATECH e-Handbook 6.1.6: Cpl =
 * (μ − LSL)/(3σ) for a lower limit, Cpu = (USL − μ)/(3σ) for an upper one); Cp needs both limits and is not given.
 */
export function oneSidedCapability(side: 'low' | 'high', limit: number, mean: number, sigma: number): number | null {
  if (!(sigma > 0) || !Number.isFinite(sigma)) return null;
  return side === 'low' ? (mean - limit) / (3 * sigma) : (limit - mean) / (3 * sigma);
}
