import type { ApiErrorCode } from '@shared/errors';

/**
 * The one error the comparison engine throws for bad input (a run without a curve, two runs with no
 * common range). Use cases turn it into an HTTP answer (422) with the same code, message and details.
 */
export class ComparisonEngineError extends Error {
  constructor(
    readonly code: ApiErrorCode,
    message: string,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = 'ComparisonEngineError';
  }
}

export const isComparisonEngineError = (e: unknown): e is ComparisonEngineError => e instanceof ComparisonEngineError;
