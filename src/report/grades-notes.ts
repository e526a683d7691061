// What the grade reports say about how the grade study was made: the grading assumptions and the search method.
// Shared by the terminal text, the JSON, the HTML tables and `grades --help`.

export const GRADING_NOTE =
  "Each grade brings its usual TCR (common practice); the shunt takes the grade's tolerance and keeps its own TCR; " +
  "resistor values stay as designed, and the search offers a part only the grades whose usual series (or a coarser " +
  "one) holds its value (common practice: a 5 % part is an E24 value).";

/** How the search works, naming the tightest grade it was allowed (e.g. "0.1 %", with a no-break space as the reports write it). */
export function searchMethod(tightest: string): string {
  return (
  'Every assignment is evaluated by Monte Carlo on the same seed and trials, so any two are compared on paired ' +
  'trials. Taking yield not to fall when a part is tightened (the usual case with the nominal inside the window): ' +
  `if every part at ${tightest} fails, nothing passes; for each part, grades that fail even with every other part at ` +
  `${tightest} are ruled out; the remaining assignments are then visited in order of total cost, cheapest first, and the ` +
  'first that reaches the target is the cheapest (assignments no tighter than a known failure are skipped). The ' +
  'answer is re-run with the full trial count.'
  );
}

/** The search as the default grades run it (tightest 0.1 %); `grades --help` shows this. */
export const SEARCH_METHOD = searchMethod('0.1 %');
