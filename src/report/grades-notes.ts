// What the grade reports say about how the grade study was made: the grading assumptions and the search method.
// Shared by the terminal text, the JSON, the HTML tables and `grades --help`.

export const GRADING_NOTE =
  "Each grade brings its usual TCR (common practice); the shunt takes the grade's tolerance and keeps its own TCR; " +
  "resistor values stay as designed, and the search offers a part only the grades whose usual series (or a coarser " +
  "one) holds its value (common practice: a 5 % part is an E24 value).";

/** How the search works, naming the tightest grade it was allowed (e.g. "0.1 %", with a no-break space as the reports write it). */
export function searchMethod(tightest: string): string {
  return (
  'Every assignment is judged on one sample of units drawn once (paired trials: each part drawn once per unit and ' +
  "mapped to each grade's band), so any two are compared on the same units and comparing costs model evaluations " +
  'only; an assignment stops being counted once more units fail than the target allows. Taking yield not to fall ' +
  `when a part is tightened (the usual case with the nominal inside the window): if every part at ${tightest} fails, ` +
  `nothing passes; for each part, grades that fail even with every other part at ${tightest} are ruled out; then a ` +
  'branch and bound fixes one part at a time, cheapest grade first, cutting a branch when its grades with every ' +
  'remaining part at its tightest fail, or when it cannot cost less than the cheapest passing mix found so far. ' +
  'The answer is re-run with the full trial count.'
  );
}

/** The search as the default grades run it (tightest 0.1 %); `grades --help` shows this. */
export const SEARCH_METHOD = searchMethod('0.1 %');
