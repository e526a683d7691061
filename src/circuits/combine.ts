// Two resistors as one leg: series and parallel equivalents (Ohm's and Kirchhoff's laws).

export function seriesResistance(a: number, b: number): number {
  return a + b;
}

export function parallelResistance(a: number, b: number): number {
  return (a * b) / (a + b);
}
