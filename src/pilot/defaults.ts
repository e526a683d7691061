// The pilot study's defaults, in a module of their own so the command's help can show them without loading the study.

/** Trials for the prediction when neither the file nor the command line says. */
export const DEFAULT_PILOT_TRIALS = 200_000;
