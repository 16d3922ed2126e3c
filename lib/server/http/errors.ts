import 'server-only';
import type { ZodError } from 'zod';

export type ErrorCode =
  | 'bad_request'
  | 'validation_failed'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'gone'
  | 'payload_too_large'
  | 'unsupported_media_type'
  | 'cross_site'
  | 'rate_limited'
  | 'study_full'
  | 'already_taken_part'
  | 'internal';

export interface FieldIssue {
  path: string;
  message: string;
}

/** An expected failure with the HTTP status and message the caller should see. */
export class AppError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: ErrorCode,
    message: string,
    public readonly issues?: FieldIssue[],
    public readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFoundError = (what = 'That item') => new AppError(404, 'not_found', `${what} was not found.`);
export const forbiddenError = (msg = 'Your role in this workspace does not allow this.') => new AppError(403, 'forbidden', msg);
export const unauthenticatedError = () => new AppError(401, 'unauthenticated', 'Sign in first.');

/** A zod failure as field issues (`path` joined with dots), for the 422 error shape. */
export function zodIssues(err: ZodError): FieldIssue[] {
  return err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}
