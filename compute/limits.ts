/**
 * Bounds and cancellation for long computations. Every search takes a {@link Budget}
 * and calls `tick()` per ephemeris evaluation (or per unit of work); the budget throws
 * {@link LimitError} when a limit is reached and {@link CancelledError} when cancelled.
 */

export class LimitError extends Error {
  /**
   * @param limit the limit's name as the user sets it, e.g. `max-evaluations`
   * @param howToRaise one sentence saying how to raise or avoid it
   */
  constructor(message: string, readonly limit: string, readonly howToRaise: string) {
    super(`${message} (${howToRaise})`);
    this.name = 'LimitError';
  }
}

export class CancelledError extends Error {
  constructor() { super('cancelled'); this.name = 'CancelledError'; }
}

/** Something that can say it was cancelled: a VS Code token adapts to this trivially. */
export interface CancelSignal { readonly isCancelled: () => boolean }

export interface Limits {
  /** Longest search span in days. */
  readonly maxSpanDays: number;
  /** Most ephemeris evaluations (or work units) one statement may use. */
  readonly maxEvaluations: number;
  /** Most Monte-Carlo trials one statement may use. */
  readonly maxTrials: number;
  /** Most events one search may return. */
  readonly maxEvents: number;
}

export const DEFAULT_LIMITS: Limits = {
  maxSpanDays: 20_000 * 365.25,
  maxEvaluations: 5_000_000,
  maxTrials: 1_000_000,
  maxEvents: 100_000,
};

export class Budget {
  private used = 0;
  constructor(readonly limits: Limits = DEFAULT_LIMITS, private readonly cancel?: CancelSignal) {}

  /** Evaluations used so far. */
  get evaluations(): number { return this.used; }

  /** Count `n` units of work; throws when over the limit or cancelled (checked every 256 units). */
  tick(n = 1): void {
    const before = this.used;
    this.used += n;
    if (this.used > this.limits.maxEvaluations) {
      throw new LimitError(`search stopped after ${this.limits.maxEvaluations} ephemeris evaluations`, 'max-evaluations',
        'shorten the span, or raise the setting orbitNotes.limits.maxEvaluations / the CLI flag --max-evaluations');
    }
    if (this.cancel && (before >> 8) !== (this.used >> 8) && this.cancel.isCancelled()) throw new CancelledError();
  }

  checkCancelled(): void {
    if (this.cancel?.isCancelled()) throw new CancelledError();
  }

  /** Throws when a span (days) is longer than allowed. */
  checkSpan(spanDays: number): void {
    if (!(spanDays > 0)) throw new RangeError('the end date must come after the start date');
    if (spanDays > this.limits.maxSpanDays) {
      throw new LimitError(`span of ${(spanDays / 365.25).toFixed(0)} years is longer than the limit of ${(this.limits.maxSpanDays / 365.25).toFixed(0)} years`, 'max-span',
        'split the span, or raise orbitNotes.limits.maxSpanYears / the CLI flag --max-span-years');
    }
  }

  checkTrials(trials: number): void {
    if (trials > this.limits.maxTrials) {
      throw new LimitError(`${trials} Monte-Carlo trials exceed the limit of ${this.limits.maxTrials}`, 'max-trials',
        'use fewer trials, or raise orbitNotes.limits.maxTrials / the CLI flag --max-trials');
    }
  }
}
