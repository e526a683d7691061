// The cheapest per-part tolerance-grade assignment that reaches a yield target, and the single upgrade that buys
// the most yield per unit cost. Pure: the caller supplies `evaluate`, which returns the yield (a fraction) of one
// assignment; the CLI runs a same-seed Monte Carlo there, so any two assignments are compared on paired trials.
//
// How the search works (exact under monotone yield; exhaustive in cost order without it):
// 1. Bounds (monotone yield: tightening a part never lowers the yield, the usual case with the nominal inside the
//    spec window). The all-tightest assignment is the best any assignment can do: if it fails, nothing passes.
//    For each part, the loosest grade that passes with every OTHER part at its tightest is the loosest grade that
//    part can have in any passing assignment; looser grades are dropped. At most parts × (grades − 1) runs.
// 2. Best-first over what is left: assignments are visited in order of total cost, cheapest first, from a priority
//    queue seeded with "every part at its cheapest remaining grade"; each visited assignment queues those that move
//    one part one step up its cost-ordered list (every assignment is reachable, none costs less than the one that
//    queued it, so the visiting order is by non-decreasing cost). The first that reaches the target is the cheapest.
//    An assignment no tighter, part by part, than one already seen to fail is skipped (monotone yield again).
// Ties in cost go to the tighter assignment (more margin for the same money), then by the order of the parts.
// `prune: false` drops the monotone assumption: no bounds, no skipping, plain cost-ordered enumeration.

/** One grade a part may be ordered in. `tightness` orders grades: a larger number is a tighter tolerance. */
export interface GradeOption {
  name: string;
  cost: number;
  tightness: number;
}

export interface GradeMixRequest {
  /** Per part, the grades it may take (any order; each part may have its own list and costs). */
  options: GradeOption[][];
  /** Required yield as a fraction (0.99 for 99 %). */
  target: number;
  /** Yield (fraction) of an assignment: index of the chosen option for each part. */
  evaluate: (assignment: readonly number[]) => number | Promise<number>;
  /** Stop after this many evaluations (default 2000). */
  maxEvaluations?: number;
  /** Skip assignments dominated by a known failure (default true). */
  prune?: boolean;
}

export interface GradeMixResult {
  found: boolean;
  /** Index into options[part] for each part (the cheapest passing assignment when found). */
  assignment: number[] | null;
  cost: number | null;
  yield: number | null;
  /** Monte Carlo runs made, and assignments skipped as dominated by a failure. */
  evaluations: number;
  skipped: number;
  /** Why the search stopped without an answer, when it did. */
  reason?: 'target-unreachable' | 'evaluation-limit';
}

interface QueueEntry {
  cost: number;
  tightness: number;
  rank: number[]; // index into each part's cost-sorted list
}

/** Finds the cheapest assignment whose yield reaches `target`; see the header for the method. */
export async function cheapestGradeMix(request: GradeMixRequest): Promise<GradeMixResult> {
  const { options, target, evaluate } = request;
  const maxEvaluations = request.maxEvaluations ?? 2000;
  const prune = request.prune ?? true;
  if (options.length === 0) {
    const y = await evaluate([]);
    return { found: y >= target, assignment: y >= target ? [] : null, cost: y >= target ? 0 : null, yield: y, evaluations: 1, skipped: 0 };
  }
  const failures: number[][] = []; // tightness vectors of assignments seen to fail
  const dominatedByFailure = (assignment: number[]): boolean =>
    failures.some((failed) => assignment.every((option, p) => options[p][option].tightness <= failed[p]));
  let evaluations = 0;
  let skipped = 0;
  const stop = (reason: GradeMixResult['reason']): GradeMixResult =>
    ({ found: false, assignment: null, cost: null, yield: null, evaluations, skipped, ...(reason ? { reason } : {}) });
  const run = async (assignment: number[]): Promise<number> => {
    evaluations += 1;
    const y = await evaluate(assignment);
    if (y < target) failures.push(assignment.map((option, p) => options[p][option].tightness));
    return y;
  };

  // 1. Bounds from the tightest assignment (monotone yield).
  const allowed = options.map((list) => list.map(() => true));
  if (prune) {
    const tightest = options.map((list) => list.reduce((best, o, i) => (o.tightness > list[best].tightness ? i : best), 0));
    if ((await run(tightest)) < target) return stop('target-unreachable');
    for (let p = 0; p < options.length; p += 1) {
      const byTightness = options[p].map((_, i) => i).sort((a, b) => options[p][a].tightness - options[p][b].tightness);
      for (const option of byTightness) {
        if (options[p][option].tightness >= options[p][tightest[p]].tightness) break;
        if (evaluations >= maxEvaluations) return stop('evaluation-limit');
        const probe = tightest.slice();
        probe[p] = option;
        if ((await run(probe)) >= target) break;
        // Fails even with every other part at its tightest: this grade and every looser one are out for part p.
        options[p].forEach((o, i) => {
          if (o.tightness <= options[p][option].tightness) allowed[p][i] = false;
        });
      }
    }
  }

  // 2. Best-first in cost order over the allowed grades (cheapest first, then tighter).
  const sorted = options.map((list, p) =>
    list
      .map((_, i) => i)
      .filter((i) => allowed[p][i])
      .sort((a, b) => list[a].cost - list[b].cost || list[b].tightness - list[a].tightness),
  );
  const toAssignment = (rank: number[]): number[] => rank.map((r, p) => sorted[p][r]);
  const entryFor = (rank: number[]): QueueEntry => {
    let cost = 0;
    let tightness = 0;
    rank.forEach((r, p) => {
      const option = options[p][sorted[p][r]];
      cost += option.cost;
      tightness += option.tightness;
    });
    return { cost, tightness, rank };
  };
  const queue = new MinQueue<QueueEntry>((a, b) => a.cost - b.cost || b.tightness - a.tightness || compareRanks(a.rank, b.rank));
  const seen = new Set<string>();
  const start = options.map(() => 0);
  queue.push(entryFor(start));
  seen.add(start.join(','));
  while (queue.size > 0) {
    const entry = queue.pop();
    const assignment = toAssignment(entry.rank);
    if (prune && dominatedByFailure(assignment)) {
      skipped += 1;
    } else {
      if (evaluations >= maxEvaluations) return stop('evaluation-limit');
      const y = await run(assignment);
      if (y >= target) return { found: true, assignment, cost: entry.cost, yield: y, evaluations, skipped };
    }
    for (let p = 0; p < entry.rank.length; p += 1) {
      if (entry.rank[p] + 1 >= sorted[p].length) continue;
      const next = entry.rank.slice();
      next[p] += 1;
      const key = next.join(',');
      if (seen.has(key)) continue;
      seen.add(key);
      queue.push(entryFor(next));
    }
  }
  return stop('target-unreachable');
}

export interface UpgradeRequest {
  options: GradeOption[][];
  /** The starting assignment (index into options[part]). */
  base: readonly number[];
  evaluate: (assignment: readonly number[]) => number | Promise<number>;
}

export interface UpgradeResult {
  baseYield: number;
  /** The best single change, or null when no change raises the yield at a positive extra cost (or for free). */
  best: { part: number; option: number; yield: number; extraCost: number; yieldPerCost: number | null } | null;
  /** Every single change tried (one part moved to one tighter grade). */
  tried: Array<{ part: number; option: number; yield: number; extraCost: number }>;
}

/**
 * The single change of one part to a tighter grade that buys the most yield per unit of extra cost. A change that
 * raises the yield at no extra cost beats any paid one (its yieldPerCost is reported as null: unbounded).
 */
export async function bestSingleUpgrade(request: UpgradeRequest): Promise<UpgradeResult> {
  const { options, base, evaluate } = request;
  const baseYield = await evaluate(base);
  const tried: UpgradeResult['tried'] = [];
  let best: UpgradeResult['best'] = null;
  let bestScore = 0;
  for (let part = 0; part < options.length; part += 1) {
    const list = options[part];
    const current = list[base[part]];
    for (let index = 0; index < list.length; index += 1) {
      const option = list[index];
      if (option.tightness <= current.tightness) continue;
      const next = base.slice();
      next[part] = index;
      const y = await evaluate(next);
      const extraCost = option.cost - current.cost;
      tried.push({ part, option: index, yield: y, extraCost });
      const gain = y - baseYield;
      if (gain <= 0) continue;
      const score = extraCost <= 0 ? Number.MAX_VALUE : gain / extraCost;
      if (score > bestScore) {
        bestScore = score;
        best = { part, option: index, yield: y, extraCost, yieldPerCost: extraCost <= 0 ? null : score };
      }
    }
  }
  return { baseYield, best, tried };
}

function compareRanks(a: number[], b: number[]): number {
  for (let i = 0; i < a.length; i += 1) if (a[i] !== b[i]) return b[i] - a[i];
  return 0;
}

/** A binary heap ordered by `less` (negative when a comes first). */
class MinQueue<T> {
  private readonly items: T[] = [];
  constructor(private readonly order: (a: T, b: T) => number) {}
  get size(): number {
    return this.items.length;
  }
  push(item: T): void {
    const items = this.items;
    items.push(item);
    let i = items.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (this.order(items[i], items[parent]) >= 0) break;
      [items[i], items[parent]] = [items[parent], items[i]];
      i = parent;
    }
  }
  pop(): T {
    const items = this.items;
    const top = items[0];
    const last = items.pop() as T;
    if (items.length > 0) {
      items[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < items.length && this.order(items[l], items[m]) < 0) m = l;
        if (r < items.length && this.order(items[r], items[m]) < 0) m = r;
        if (m === i) break;
        [items[i], items[m]] = [items[m], items[i]];
        i = m;
      }
    }
    return top;
  }
}
