// The cheapest per-part tolerance-grade assignment that reaches a yield target, and the single upgrade that buys
// the most yield per unit cost. Pure: the caller supplies `evaluate`, which returns the yield (a fraction) of one
// assignment; the CLI runs a same-seed Monte Carlo there, so any two assignments are compared on paired trials.
//
// How the search works (exact under monotone yield; exhaustive in cost order without it):
// 1. Bounds (monotone yield: tightening a part never lowers the yield, the usual case with the nominal inside the
//    spec window). The all-tightest assignment is the best any assignment can do: if it fails, nothing passes.
//    For each part, the loosest grade that passes with every OTHER part at its tightest is the loosest grade that
//    part can have in any passing assignment; looser grades are dropped. At most parts × (grades − 1) runs (with
//    a `screen`, these probes are screened only: one it cannot reject counts as passing, which keeps more grades).
// 2. Branch and bound (depth first) over what is left. Parts are taken one at a time, the one whose cheapest
//    allowed grade costs most first; a node fixes the grades of the parts taken so far. Its relaxation, those grades
//    with every part not yet taken at its tightest, is the best any assignment below the node can do (monotone
//    yield), so a node whose relaxation fails is cut with everything below it. A node is also cut, unevaluated,
//    when its cost plus the cheapest allowed grade of every part not yet taken cannot beat the cheapest passing
//    assignment found so far. Grades are tried cheapest first, so the first descent is the greedy answer and the
//    bound cuts hard from then on. The answer is the cheapest passing assignment (the search visits or cuts every
//    assignment, cutting only what cannot pass or cannot be cheaper).
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
  /**
   * Optional cheap check of a partial step (a node's relaxation, see the header): true only when the assignment
   * certainly misses the target (e.g. more failing units already counted than the target allows). A node it
   * cannot reject is descended into without a full evaluation; only full assignments are evaluated in full.
   */
  screen?: (assignment: readonly number[]) => boolean | Promise<boolean>;
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
  /** Assignments evaluated, and branches cut without evaluation (dominated by a failure, or by cost). */
  evaluations: number;
  skipped: number;
  /** Relaxations rejected by `screen`, and screened without a verdict (descended into). */
  screened?: { rejected: number; open: number };
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
  // Each assignment is evaluated once (the branch and bound can reach one assignment along two paths).
  const known = new Map<string, number>();
  const run = async (assignment: number[]): Promise<number> => {
    const key = assignment.join(',');
    const cached = known.get(key);
    if (cached !== undefined) return cached;
    evaluations += 1;
    const y = await evaluate(assignment);
    known.set(key, y);
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
        // With a screen, a probe it cannot reject is taken as passing: that only keeps more grades allowed.
        if (request.screen ? !(await request.screen(probe)) : (await run(probe)) >= target) break;
        // Fails even with every other part at its tightest: this grade and every looser one are out for part p.
        options[p].forEach((o, i) => {
          if (o.tightness <= options[p][option].tightness) allowed[p][i] = false;
        });
      }
    }
    // 2. Branch and bound over the allowed grades.
    const screened = { rejected: 0, open: 0 };
    const screen = request.screen;
    const bbInput: BranchAndBoundInput = { options, allowed, tightest, target, run, limitReached: () => evaluations >= maxEvaluations, skip: () => (skipped += 1) };
    if (screen) {
      bbInput.screen = async (assignment) => {
        const rejected = await screen(assignment);
        if (rejected) screened.rejected += 1;
        else screened.open += 1;
        return rejected;
      };
    }
    const answer = await branchAndBound(bbInput);
    const extra = screen ? { screened } : {};
    if (answer === 'evaluation-limit') return { ...stop('evaluation-limit'), ...extra };
    if (answer === null) return { ...stop('target-unreachable'), ...extra };
    return { found: true, assignment: answer.assignment, cost: answer.cost, yield: answer.yield, evaluations, skipped, ...extra };
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
  /**
   * Optional: the yield when it is at least `floor`, else any value below `floor` (a count that may stop early).
   * A change whose yield is below the floor it is given cannot be the best, so its exact yield is not needed.
   */
  evaluateAbove?: (assignment: readonly number[], floor: number) => number | Promise<number>;
}

export interface UpgradeResult {
  baseYield: number;
  /** The best single change, or null when no change raises the yield at a positive extra cost (or for free). */
  best: { part: number; option: number; yield: number; extraCost: number; yieldPerCost: number | null } | null;
  /** Every single change tried (one part moved to one tighter grade); `below` when its yield is only known to be
   *  under the floor it had to beat (then `yield` is an upper bound). */
  tried: Array<{ part: number; option: number; yield: number; extraCost: number; below?: true }>;
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
      const extraCost = option.cost - current.cost;
      // What this change must exceed to be the best so far (gain > 0, and gain / cost above the best score), less a
      // slack far below one unit in any trial count, so rounding never prunes a change that would win.
      const floor: number = (extraCost <= 0 || best === null ? baseYield : baseYield + bestScore * extraCost) - FLOOR_SLACK;
      if (request.evaluateAbove && floor > 1) {
        // No yield reaches it (a free change already won, or the score needs more than every unit): 1 bounds it.
        tried.push({ part, option: index, yield: 1, extraCost, below: true });
        continue;
      }
      const y: number = request.evaluateAbove ? await request.evaluateAbove(next, floor) : await evaluate(next);
      if (request.evaluateAbove && y < floor) {
        tried.push({ part, option: index, yield: y, extraCost, below: true });
        continue;
      }
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

interface BranchAndBoundInput {
  options: GradeOption[][];
  allowed: boolean[][];
  tightest: number[];
  target: number;
  run: (assignment: number[]) => Promise<number>;
  limitReached: () => boolean;
  skip: () => void;
  screen?: (assignment: number[]) => Promise<boolean>;
}

interface Candidate {
  assignment: number[];
  cost: number;
  tightness: number;
  /** Rank of each part's grade in its cost-ordered list (the tie-break of the cost order). */
  rank: number[];
  yield: number;
}

/** Relative slack in comparing sums of costs (their order of addition differs between paths). */
const COST_SLACK = 1e-12;

/** Step 2 of the search (see the header). Null when nothing passes; 'evaluation-limit' when the limit stopped it. */
async function branchAndBound(input: BranchAndBoundInput): Promise<Candidate | null | 'evaluation-limit'> {
  const { options, allowed, tightest, target, run } = input;
  const parts = options.length;
  // Each part's allowed grades, cheapest first (tighter first among equal costs), as the cost order ranks them.
  const sorted = options.map((list, p) =>
    list
      .map((_, i) => i)
      .filter((i) => allowed[p]![i])
      .sort((a, b) => list[a]!.cost - list[b]!.cost || list[b]!.tightness - list[a]!.tightness),
  );
  if (sorted.some((list) => list.length === 0)) return null;
  const cheapest = sorted.map((list, p) => options[p]![list[0]!]!.cost);
  // The most expensive parts first: their grades decide most of the cost, and their failures cut the most.
  const order = options
    .map((_, p) => p)
    .sort((a, b) => cheapest[b]! - cheapest[a]! || sorted[a]!.length - sorted[b]!.length || a - b);
  // restMin[d]: the cheapest the parts order[d..] can cost together.
  const restMin = new Array<number>(parts + 1).fill(0);
  for (let d = parts - 1; d >= 0; d -= 1) restMin[d] = restMin[d + 1]! + cheapest[order[d]!]!;
  let best: Candidate | null = null;
  const beats = (c: Omit<Candidate, 'yield' | 'assignment'>, b: Candidate): boolean => {
    const slack = COST_SLACK * Math.max(1, Math.abs(b.cost));
    if (c.cost < b.cost - slack) return true;
    if (c.cost > b.cost + slack) return false;
    if (c.tightness !== b.tightness) return c.tightness > b.tightness;
    return compareRanks(c.rank, b.rank) < 0;
  };
  const cannotBeat = (lowerBound: number): boolean => best !== null && lowerBound > best.cost + COST_SLACK * Math.max(1, Math.abs(best.cost));
  // Known answers as tightness vectors: an assignment no tighter, part by part, than a failure fails, and one at
  // least as tight as a pass passes (monotone yield), so neither needs a Monte Carlo run.
  const tightnessOf = (a: readonly number[]): number[] => a.map((option, p) => options[p]![option]!.tightness);
  const passes: number[][] = [];
  const failures: number[][] = [];
  const noTighter = (t: readonly number[], than: readonly number[]): boolean => t.every((x, p) => x <= than[p]!);
  const assignment = tightest.slice();
  let limited = false;
  /** Whether the assignment passes, and its yield when it was run (null when a known answer or the screen decided). */
  const judge = async (exact: boolean): Promise<{ pass: boolean; yield: number | null; known?: true } | 'evaluation-limit'> => {
    const t = tightnessOf(assignment);
    if (failures.some((f) => noTighter(t, f))) return { pass: false, yield: null, known: true };
    if (!exact && passes.some((q) => noTighter(q, t))) return { pass: true, yield: null, known: true };
    if (!exact && input.screen) {
      // A relaxation: screened only; a rejection is a known failure, anything else is descended into.
      if (await input.screen(assignment)) {
        failures.push(t);
        return { pass: false, yield: 0 };
      }
      return { pass: true, yield: null };
    }
    if (input.limitReached()) return 'evaluation-limit';
    const y = await run(assignment);
    (y >= target ? passes : failures).push(t);
    return { pass: y >= target, yield: y };
  };
  const descend = async (d: number, costSoFar: number): Promise<void> => {
    const p = order[d]!;
    for (const option of sorted[p]!) {
      if (cannotBeat(costSoFar + options[p]![option]!.cost + restMin[d + 1]!)) {
        input.skip();
        break; // the rest of this part's list costs as much or more
      }
      assignment[p] = option;
      if (d + 1 === parts) {
        // A full assignment: run only when it would be the new answer (its yield is then reported).
        const full = costAndRank(options, sorted, assignment);
        if (best !== null && !beats(full, best)) {
          input.skip();
          continue;
        }
        const verdict = await judge(true);
        if (verdict === 'evaluation-limit') {
          limited = true;
          return;
        }
        if (verdict.pass) best = { ...full, assignment: assignment.slice(), yield: verdict.yield! };
        else if (verdict.known) input.skip();
        continue;
      }
      const verdict = await judge(false);
      if (verdict === 'evaluation-limit') {
        limited = true;
        return;
      }
      if (verdict.known) input.skip();
      if (verdict.pass) await descend(d + 1, costSoFar + options[p]![option]!.cost);
      if (limited) return;
    }
    assignment[p] = tightest[p]!;
  };
  await descend(0, 0);
  if (limited) return 'evaluation-limit';
  return best;
}

/** Cost (summed in part order, as the cost order sums it), total tightness and ranks of a full assignment. */
function costAndRank(options: GradeOption[][], sorted: number[][], assignment: readonly number[]): Omit<Candidate, 'assignment' | 'yield'> {
  let cost = 0;
  let tightness = 0;
  const rank = assignment.map((option, p) => {
    cost += options[p]![option]!.cost;
    tightness += options[p]![option]!.tightness;
    return sorted[p]!.indexOf(option);
  });
  return { cost, tightness, rank };
}

/** Slack below an upgrade's floor (yields are multiples of 1/trials, far coarser). */
const FLOOR_SLACK = 1e-9;

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
