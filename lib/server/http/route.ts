import 'server-only';
import { NextResponse, type NextRequest } from 'next/server';
import { ZodError, type ZodType } from 'zod';
import type { Role } from '@/lib/roles';
import { AppError, type FieldIssue } from './errors';
import { authorise, type WorkspaceContext } from '@/lib/server/team/membership';
import { currentUser } from '@/lib/server/team/session';

export function jsonError(status: number, code: string, message: string, issues?: FieldIssue[], headers?: Record<string, string>) {
  return NextResponse.json({ error: { code, message, ...(issues ? { issues } : {}) } }, { status, headers });
}

export function zodIssues(err: ZodError): FieldIssue[] {
  return err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}

/** Turns any thrown value into the one JSON error shape; unexpected errors leak nothing. */
export function toErrorResponse(err: unknown) {
  if (err instanceof AppError) return jsonError(err.status, err.code, err.message, err.issues, err.headers);
  if (err instanceof ZodError) return jsonError(422, 'validation_failed', 'Some fields are not valid.', zodIssues(err));
  console.error('[api] unexpected error', err);
  return jsonError(500, 'internal', 'Something went wrong on our side. Try again in a moment.');
}

/** Reads and validates a JSON body: malformed JSON is a 400, a schema mismatch a 422. */
export async function readJson<T>(req: Request, schema: ZodType<T>): Promise<T> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new AppError(400, 'bad_request', 'The request body is not valid JSON.');
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw new AppError(422, 'validation_failed', 'Some fields are not valid.', zodIssues(parsed.error));
  return parsed.data;
}

type Params = Record<string, string | string[]>;
type RouteCtx<P extends Params> = { params: Promise<P> };

/** A route handler that needs a signed-in member of the workspace in the URL. */
export function workspaceRoute<P extends Params & { workspace: string }>(
  minimum: Role,
  handler: (req: NextRequest, ctx: WorkspaceContext, params: P) => Promise<Response>,
) {
  return async (req: NextRequest, route: RouteCtx<P>) => {
    try {
      const params = await route.params;
      const ctx = await authorise(await currentUser(), params.workspace, minimum);
      return await handler(req, ctx, params);
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

/** A route handler that needs only a signed-in user. */
export function userRoute(handler: (req: NextRequest, user: NonNullable<Awaited<ReturnType<typeof currentUser>>>) => Promise<Response>) {
  return async (req: NextRequest) => {
    try {
      const user = await currentUser();
      if (!user) throw new AppError(401, 'unauthenticated', 'Sign in first.');
      return await handler(req, user);
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

