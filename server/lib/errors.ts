import type { ApiErrorCode } from '@shared/errors';

/**
 * The one error type the API answers with. `code` is stable (clients and tests match on it),
 * `message` is plain words for a person, `details` carries field errors or hints.
 */
export class AppError extends Error {
  constructor(
    readonly code: ApiErrorCode,
    message: string,
    readonly status = 400,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const notFound = (what: string) => new AppError('NOT_FOUND', `${what} not found`, 404);
export const forbidden = (message = 'You do not have permission to do that') => new AppError('FORBIDDEN', message, 403);
export const unauthenticated = () => new AppError('UNAUTHENTICATED', 'Sign in first', 401);
export const conflict = (code: ApiErrorCode, message: string, details?: unknown) => new AppError(code, message, 409, details);
