// The range of bottom-leg resistance a divider may use: the intersection of the bottom-resistor range, the divider
// current window (I = Vref/Rbottom, so a current window is a resistance window) and the feedback-pin rule
// (divider current at least `biasRatio` × |Ifb| so the pin's bias current barely moves the output: common practice,
// 100× by default). An empty intersection is an ImpossibleError naming the constraints that clash.
import { ImpossibleError, InputError } from '../../errors.js';
import { formatEngineering } from '../../units/index.js';

export interface Interval {
  lo: number;
  hi: number;
}

export interface BottomWindowRequest {
  vref: number;
  ifb: number;
  /** Bottom-leg resistance range, ohms. */
  bottom: Interval;
  /** Divider current window, amperes (optional). */
  current?: Interval | undefined;
  /** Divider current must be at least this multiple of |Ifb|; 0 turns the rule off. */
  biasRatio: number;
  /** The bias ratio is fixed where the request came from (a design file has no --bias-ratio): the remedy then does
   * not offer to lower it. */
  biasRatioFixed?: boolean | undefined;
}

export interface BottomWindow {
  lo: number;
  hi: number;
  /** Geometric middle of the window: the divider current Vref/middle is the middle of the current window. */
  middle: number;
  /** Largest bottom-leg resistance the feedback-pin rule allows on its own (Infinity when it does not apply). */
  biasLimit: number;
}

export function bottomWindow(request: BottomWindowRequest): BottomWindow {
  const { vref, ifb, bottom, current, biasRatio } = request;
  let lo = bottom.lo;
  let hi = bottom.hi;
  const clauses = [`--bottom ${fmt(bottom.lo)}..${fmt(bottom.hi)}`];
  if (current && !(current.lo > 0 && current.hi >= current.lo)) {
    // A negative or zero current would turn into a negative (or infinite) resistance window, silently ignored.
    throw new InputError('--current', `the divider current window ${formatEngineering(current.lo, 'A')}..${formatEngineering(current.hi, 'A')} is not above zero`, 'LO..HI with 0 < LO ≤ HI, e.g. 10uA..1mA');
  }
  if (current) {
    lo = Math.max(lo, vref / current.hi);
    hi = Math.min(hi, current.lo > 0 ? vref / current.lo : Infinity);
    clauses.push(`--current ${formatEngineering(current.lo, 'A')}..${formatEngineering(current.hi, 'A')} (Rbottom ${fmt(vref / current.hi)}..${fmt(vref / current.lo)})`);
  }
  let biasLimit = ifb < 0 ? (vref / -ifb) * (1 - 1e-9) : Infinity;
  if (biasRatio > 0 && ifb !== 0) {
    const ruleMax = vref / (biasRatio * Math.abs(ifb));
    biasLimit = Math.min(biasLimit, ruleMax);
    hi = Math.min(hi, ruleMax);
    clauses.push(`the feedback-pin rule (divider current ≥ ${biasRatio}×|Ifb| needs Rbottom ≤ ${fmt(ruleMax)})`);
  }
  if (ifb < 0) {
    // A bias current out of the pin larger than Vref/Rbottom leaves no current for Rtop: no output above Vref.
    hi = Math.min(hi, (vref / -ifb) * (1 - 1e-9));
  }
  if (!(lo <= hi) || !(hi > 0)) {
    const biasRemedy = request.biasRatioFixed ? 'use a regulator with a smaller bias current (--ifb)' : 'use a regulator with a smaller bias current (--ifb) or lower --bias-ratio';
    throw new ImpossibleError(
      current ? '--bottom/--current' : '--bottom',
      `no bottom resistor satisfies ${clauses.join(' and ')}`,
      `widen --bottom or --current, or (if the feedback-pin rule binds) ${biasRemedy}`,
    );
  }
  return { lo, hi, middle: Math.sqrt(lo * hi), biasLimit };
}

function fmt(ohms: number): string {
  return Number.isFinite(ohms) ? formatEngineering(ohms, 'Ω') : 'no limit';
}
