/** Why an integration stopped before its end time. */
export type IntegrationFailure =
  /** The step budget (`maxSteps`) ran out. */
  | 'step-limit'
  /** The wall-time budget ran out. */
  | 'time-limit'
  /** A state grew past its blow-up bound. */
  | 'blow-up'
  /** A state became NaN or infinite. */
  | 'non-finite'
  /** A level fell below zero by more than the absolute tolerance. */
  | 'negative-level';

/** Counters of one integration, as ODEX reports them plus our own RHS count. */
export interface IntegrationDiagnostics {
  /** Steps attempted (accepted + rejected), as ODEX counts them. */
  readonly steps: number;
  /** Accepted steps. */
  readonly accepted: number;
  /** Rejected steps. */
  readonly rejected: number;
  /** Right-hand-side evaluations actually made (counted by the adapter). */
  readonly rhsEvaluations: number;
}

/**
 * Thrown when an integration cannot finish: the `code` names the cause, `time` the model time
 * reached, `level` the offending level (index and id) for blow-up, non-finite or negative
 * states.
 */
export class IntegrationError extends Error {
  override readonly name = 'IntegrationError';
  constructor(
    /** The cause. */
    readonly code: IntegrationFailure,
    message: string,
    /** Model time reached when it stopped. */
    readonly time: number,
    /** Counters up to the stop. */
    readonly diagnostics: IntegrationDiagnostics,
    /** Index of the level at fault, if one is. */
    readonly levelIndex?: number,
    /** Id of the level at fault, if one is. */
    readonly levelId?: string,
  ) {
    super(message);
  }
}
