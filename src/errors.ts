// Typed errors raised at the boundary (input parsing, design files, impossible requests).
// The core throws these; src/cli turns each into one line on stderr and exit code 2.
// Any layer may import this file: it holds no logic of its own.

/** Input that cannot be read: says what was given, where (field path or option) and what is accepted. */
export class InputError extends Error {
  readonly where: string;
  readonly accepted: string;
  constructor(where: string, problem: string, accepted: string) {
    super(problem);
    this.name = 'InputError';
    this.where = where;
    this.accepted = accepted;
  }
}

/** A well-formed request that physics or the constraints cannot satisfy: says why and what to change. */
export class ImpossibleError extends Error {
  readonly where: string;
  readonly remedy: string;
  constructor(where: string, problem: string, remedy: string) {
    super(problem);
    this.name = 'ImpossibleError';
    this.where = where;
    this.remedy = remedy;
  }
}

/** One line for a user: `where: problem; accepted: …` or `where: problem; to fix: …`. */
export function describeError(error: InputError | ImpossibleError): string {
  const place = error.where ? `${error.where}: ` : '';
  if (error instanceof InputError) return `${place}${error.message}; accepted: ${error.accepted}`;
  return `${place}${error.message}; to fix: ${error.remedy}`;
}
