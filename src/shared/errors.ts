/**
 * Every error code the API answers with, as one closed union shared by server and client, so
 * neither side matches a string the other never sends. Add a code here before throwing it.
 * Run-file reading codes come from the engine (src/shared/analysis/errors.ts).
 */
import type { AnalysisErrorCode } from './analysis/errors';

export const API_ERROR_CODES = [
  // access and input
  'UNAUTHENTICATED',
  'FORBIDDEN',
  'CROSS_ORIGIN',
  'VALIDATION_FAILED',
  'BAD_JSON',
  'BODY_TOO_LARGE',
  'BAD_CURSOR',
  'RATE_LIMITED',
  'NOT_FOUND',
  'INTERNAL',
  'DATABASE_UNAVAILABLE',
  // accounts
  'BAD_CREDENTIALS',
  'PASSWORD_WRONG',
  'TOKEN_INVALID',
  'EMAIL_TAKEN',
  'ALREADY_ACTIVE',
  'CANNOT_DEMOTE_SELF',
  // customers, bikes, sessions, stages
  'CUSTOMER_HAS_BIKES',
  'CUSTOMER_REQUIRED',
  'SAFETY_CHECK_REQUIRED',
  'SESSION_OTHER_BIKE',
  'STAGE_ORDER_INVALID',
  // runs and files
  'NO_FILES',
  'TOO_MANY_FILES',
  'UPLOAD_REFUSED',
  'FILE_REQUIRED',
  'NOT_DELETED',
  'RUN_NOT_READY',
  'RAW_MISMATCH',
  'PULL_NOT_FOUND',
  'OBJECT_MISSING',
  'STORAGE_UNAVAILABLE',
  'SAVE_FAILED',
  'FAILED',
  'UNSUPPORTED_IMAGE',
  'IMAGE_TOO_LARGE',
  // comparisons and reports
  'COMPARISON_NOT_COMPUTABLE',
  'NO_PREVIEW',
  'REPORT_VERSION_EXISTS',
  'MAIL_FAILED',
  'OUTBOX_DISABLED',
  // bay capture (device tokens, on the dyno now, inbox)
  'DEVICE_TOKEN_REFUSED',
  'DEVICE_TOKEN_NOT_HERE',
  'INBOX_ALREADY_ASSIGNED',
  'SESSION_OTHER_DYNO',
  'STAGE_OTHER_BIKE',
  // build plans and payments
  'PLAN_STATE',
  'DEPOSIT_NOT_DUE',
  'PAYMENTS_UNAVAILABLE',
  'WEBHOOK_INVALID',
  // malformed requests (hardening)
  'UNSUPPORTED_ENCODING',
  'BAD_ENCODING',
  'MALFORMED_MULTIPART',
  'INVALID_VALUE',
  'BAD_REQUEST',
] as const;

/** A code the API may answer with: its own, or the run-file reader's. */
export type ApiErrorCode = (typeof API_ERROR_CODES)[number] | AnalysisErrorCode;

/** The body of every error answer. */
export interface ApiErrorBody {
  error: { code: ApiErrorCode; message: string; details?: unknown };
}

/** Field problems of a VALIDATION_FAILED answer (`details`). */
export interface ValidationDetails {
  fields: { path: string; message: string }[];
}
