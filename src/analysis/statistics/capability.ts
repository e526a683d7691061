// Process capability indices (NIST/SEMATECH e-Handbook of Statistical Methods, 6.1.6):
//   Cp = (USL − LSL)/(6σ),   Cpk = min(USL − μ, μ − LSL)/(3σ).

export function processCapability(lsl: number, usl: number, mean: number, sigma: number): { cp: number; cpk: number } | null {
  if (!(sigma > 0) || !Number.isFinite(sigma)) return null;
  return { cp: (usl - lsl) / (6 * sigma), cpk: Math.min(usl - mean, mean - lsl) / (3 * sigma) };
}
