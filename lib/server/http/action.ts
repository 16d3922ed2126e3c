import 'server-only';
import { ZodError } from 'zod';
import type { ActionResult } from '@/lib/action-result';
import { AppError } from './errors';
import { withRequestContext } from '@/lib/server/db/orm';

/** Runs a server action body, turning expected failures into values the form can show. */
export async function actionResult<T>(fn: () => Promise<T>): Promise<ActionResult<T>> {
  try {
    return { ok: true, data: await withRequestContext(fn) };
  } catch (err) {
    if (err instanceof ZodError) {
      const fieldErrors: Record<string, string> = {};
      for (const i of err.issues) fieldErrors[i.path.join('.')] ??= i.message;
      return { ok: false, message: 'Some fields need attention.', fieldErrors };
    }
    if (err instanceof AppError) {
      const fieldErrors = err.issues ? Object.fromEntries(err.issues.map((i) => [i.path, i.message])) : undefined;
      return { ok: false, message: err.message, fieldErrors };
    }
    // Next.js control flow (redirect, notFound) must pass through.
    if (err && typeof err === 'object' && 'digest' in err) throw err;
    console.error('[action] unexpected error', err);
    return { ok: false, message: 'Something went wrong on our side. Try again in a moment.' };
  }
}
