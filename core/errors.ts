/**
 * Typed errors of the core. Each names the input field at fault (a dotted path such as
 * `leakageTest.points[2].pa`) and says, in plain words, what was expected.
 */

/** One problem with an input: where it is and what was expected there. */
export interface InputProblem {
  /** Dotted path of the field, e.g. `measures[3].reductionCfm50.low`; empty for the whole input. */
  path: string;
  /** What was expected, in plain words. */
  message: string;
}

/** Raised when an input cannot be used. Carries every problem found, not just the first. */
export class InputError extends Error {
  override readonly name = 'InputError';
  readonly problems: readonly InputProblem[];

  constructor(problems: readonly InputProblem[]) {
    super(problems.map((p) => (p.path ? `${p.path}: ${p.message}` : p.message)).join('\n'));
    this.problems = problems;
  }

  /** An error about one field. */
  static at(path: string, message: string): InputError {
    return new InputError([{ path, message }]);
  }

  /** The first field at fault, for callers that show one. */
  get field(): string {
    return this.problems[0]?.path ?? '';
  }
}
