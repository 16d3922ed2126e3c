import 'server-only';
// Pages show Next's not-found page where a route handler would answer 404: a missing object
// and another workspace's object look the same (existence does not leak). This is the one
// place that turns the data layer's 404 into that page.
import { notFound } from 'next/navigation';
import { AppError } from './errors';

/** For pages: the awaited value, or the not-found page when the data layer says 404. */
export async function orNotFound<T>(promise: Promise<T>): Promise<T> {
  try {
    return await promise;
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
}
