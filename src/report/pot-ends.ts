// An adjustable output is analysed at both ends of its pot's travel. The current-sense path never reads the divider,
// and both ends draw the same parts from the same seed, so only these outputs differ between the ends: the reports
// show the others once, at the top of the travel.
export const POT_OUTPUTS: readonly string[] = ['vout', 'dividerCurrent'];
