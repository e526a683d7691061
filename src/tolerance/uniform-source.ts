// A source of uniform random numbers in [0, 1), passed in to everything that draws (never the global unseeded generator).
export type UniformSource = () => number;

/**
 * Half of the 2^-32 grid step of 32-bit generators such as Alea: an exact 0 from the source is read as this value,
 * so inverse-CDF transforms never see 0 (which would map to −∞). The bias this introduces is below 1e-10.
 */
export const SMALLEST_UNIFORM = 2 ** -33;
