// One error type for every computation in this package, so the API can map
// each code to a 400 (or 409) in a single exhaustive switch.
export type ComputationErrorCode =
  | 'invalid-decimal'
  | 'invalid-argument'
  | 'not-whole-cents'
  | 'unsafe-cents'
  | 'unknown-machine-class'
  | 'rate-not-found'
  | 'missing-diesel-price'
  | 'missing-machine-hours'
  | 'unbalanced-balances'
  | 'custom-rate-not-above-variable-cost';

export class ComputationError extends Error {
  override readonly name = 'ComputationError';

  constructor(
    readonly code: ComputationErrorCode,
    message: string,
  ) {
    super(message);
  }
}
