// Pareto front of two objectives, both minimised: the items no other item beats in one objective without losing
// in the other. An item is dominated when another is ≤ in both objectives and < in at least one.
// Sort by the first objective (then the second) and sweep, keeping each item that improves on the best second
// objective seen so far: O(n log n). Items equal in both objectives are all kept (neither dominates the other).

export function paretoFront<T>(items: readonly T[], first: (item: T) => number, second: (item: T) => number): T[] {
  const keyed = items.map((item) => ({ item, a: first(item), b: second(item) }));
  keyed.sort((x, y) => x.a - y.a || x.b - y.b);
  const front: T[] = [];
  let bestA = NaN;
  let bestB = Infinity;
  for (const { item, a, b } of keyed) {
    if (b < bestB) {
      front.push(item);
      bestA = a;
      bestB = b;
    } else if (b === bestB && a === bestA) {
      front.push(item);
    }
  }
  return front;
}
