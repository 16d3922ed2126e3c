import 'server-only';
// The one server-action wrapper, the counterpart of `route()`: every exported action is
// `action({ auth, ... }, fn)`. It resolves the caller exactly as a route does — a member of
// the workspace named by the action's first argument (its slug), a signed-in user, or nobody
// with the reason written down — opens one request-scoped EntityManager, and turns expected
// failures into values the form shows (`ActionResult`). An outsider's call ends before `fn`.
import { ZodError } from 'zod';
import type { ActionResult } from '@/lib/action-result';
import type { Role } from '@/lib/roles';
import { AppError, unauthenticatedError } from './errors';
import { withRequestContext } from '@/lib/server/db/orm';
import { authorise, type WorkspaceContext } from '@/lib/server/team/membership';
import { currentUser, type SessionUser } from '@/lib/server/team/session';

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

/** Who may call an action. `member` actions take the workspace slug as their first argument. */
export type ActionAuth =
  | { auth: 'member'; role: Role }
  | { auth: 'user' }
  | { auth: 'public'; reason: string };

export type ActionCaller<A extends ActionAuth> = A extends { auth: 'member' }
  ? { ctx: WorkspaceContext }
  : A extends { auth: 'user' }
    ? { user: SessionUser }
    : Record<never, never>;

type Callable<A extends ActionAuth, Args extends unknown[], T> = (
  ...args: A extends { auth: 'member' } ? [slug: string, ...Args] : Args
) => Promise<ActionResult<T>>;

async function resolveCaller(spec: ActionAuth, args: unknown[]): Promise<Record<string, unknown>> {
  switch (spec.auth) {
    case 'member':
      return { ctx: await authorise(await currentUser(), typeof args[0] === 'string' ? args[0] : '', spec.role) };
    case 'user': {
      const user = await currentUser();
      if (!user) throw unauthenticatedError();
      return { user };
    }
    case 'public':
      return {};
  }
}

/** What `action()` recorded about an exported action (read by the generated isolation test). */
export interface ActionGuard {
  spec: ActionAuth;
  /** The body, called as `fn(caller, ...args)` (without the slug for member actions). */
  fn: (...args: never[]) => unknown;
}
const guards = new WeakMap<object, ActionGuard>();
export const actionGuard = (exported: unknown): ActionGuard | undefined =>
  typeof exported === 'function' ? guards.get(exported) : undefined;

/** The one server-action wrapper (see the header). */
export function action<const A extends ActionAuth, Args extends unknown[], T>(
  spec: A,
  fn: (caller: ActionCaller<A>, ...args: Args) => Promise<T>,
): Callable<A, Args, T> {
  const run = async (...args: unknown[]) =>
    actionResult(async () => {
      const caller = await resolveCaller(spec, args);
      const rest = (spec.auth === 'member' ? args.slice(1) : args) as Args;
      return fn(caller as ActionCaller<A>, ...rest);
    });
  guards.set(run, { spec, fn: fn as ActionGuard['fn'] });
  return run as Callable<A, Args, T>;
}

/**
 * The same guard for a `<form action>` whose only answer is a redirect (sign-out): React
 * ignores a form action's return value, so a refusal is thrown to the error page instead.
 */
export function formAction<const A extends Exclude<ActionAuth, { auth: 'member' }>>(spec: A, fn: (caller: ActionCaller<A>) => Promise<void>): () => Promise<void> {
  const run = action(spec, fn) as () => Promise<ActionResult<void>>;
  const submit = async () => {
    const out = await run();
    if (!out.ok) throw new Error(out.message);
  };
  guards.set(submit, { spec, fn: fn as ActionGuard['fn'] });
  return submit;
}
