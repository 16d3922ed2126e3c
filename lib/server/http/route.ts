import 'server-only';
// The HTTP boundary: every route handler is `route({ auth, ... }, handler)`. The wrapper
// resolves who is calling (a workspace member from the session, a signed-in user, a personal
// access token, or nobody — with the reason written down), opens one request-scoped
// EntityManager, and turns the handler's result into a response: a DTO becomes JSON, `reply()`
// sets a status or headers, a `Response` (files, redirects, HTML) passes through, and an
// AppError or ZodError becomes the one error shape `{ error: { code, message, issues? } }`.
// The data layer below never builds a Response. Before any handler sees a write (POST, PUT,
// PATCH, DELETE) the wrapper refuses cross-site senders, body types the route does not declare
// and bodies over its size limit, read while streaming (./request-guard.ts); a JSON answer
// carries its own `default-src 'none'` policy unless the handler set one.
import { NextRequest, NextResponse } from 'next/server';
import { ZodError, type ZodType } from 'zod';
import type { Role } from '@/lib/roles';
import { withRequestContext } from '@/lib/server/db/orm';
import { AppError, unauthenticatedError, zodIssues, type FieldIssue } from './errors';
import { BODY_LIMITS, checkBodyType, checkDeclaredLength, checkSameOrigin, isSafeMethod, readBounded, type RouteOptions } from './request-guard';

export { zodIssues };
import { authorise, type WorkspaceContext } from '@/lib/server/team/membership';
import { currentUser, type SessionUser } from '@/lib/server/team/session';
import { authenticateToken } from '@/lib/server/team/access-tokens';

function jsonError(status: number, code: string, message: string, issues?: FieldIssue[], headers?: Record<string, string>) {
  return NextResponse.json({ error: { code, message, ...(issues ? { issues } : {}) } }, { status, headers });
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

/** A DTO with a status other than 200, or extra headers (201 created, 202 pending, 204 …). */
export class Reply<T> {
  constructor(
    readonly body: T | null,
    readonly status: number,
    readonly headers: Record<string, string> = {},
  ) {}
}
export const reply = <T>(body: T | null, status: number, headers?: Record<string, string>) => new Reply<T>(body, status, headers);
export const noContent = () => new Reply<never>(null, 204);

/** Dynamic segments as handlers see them: a catch-all segment's parts arrive joined by "/". */
type Params = Record<string, string>;
type RawParams = Record<string, string | string[]>;

// The handler's result type rides on the exported function as a phantom property, so client
// code types a response as `RouteDto<typeof GET>` — from the handler, never a second interface.
declare const DTO: unique symbol;
/** A route handler as Next.js calls it, carrying the type of what its own handler returned. */
export type RouteHandler<Out> = ((req: Request, routeCtx?: { params: Promise<RawParams> }) => Promise<Response>) & { readonly [DTO]: Out };
type BodyOf<T> = T extends Reply<infer B> ? B : T extends Response ? never : T;
/** The JSON body a client receives from a 2xx answer of `H` (a `Response` — a file — adds nothing). */
export type RouteDto<H> = H extends { readonly [DTO]: infer Out } ? BodyOf<Awaited<Out>> : never;

/** Who may call a route. `public` needs a written reason (respondents, webhooks, sign-in). */
export type RouteAuth =
  | { auth: 'member'; role: Role }
  | { auth: 'user' }
  | { auth: 'token' }
  | { auth: 'public'; reason: string };

type Caller<A extends RouteAuth> = A extends { auth: 'member' } | { auth: 'token' }
  ? { ctx: WorkspaceContext }
  : A extends { auth: 'user' }
    ? { user: SessionUser }
    : Record<never, never>;

/** A route's whole declaration: who may call it, and what body and origin its writes take. */
export type RouteSpec = RouteAuth & RouteOptions;

export type RouteInput<A extends RouteAuth, P extends Params = Params> = { req: NextRequest; params: P } & Caller<A>;

async function resolveCaller(spec: RouteAuth, req: NextRequest, params: Params): Promise<Record<string, unknown>> {
  switch (spec.auth) {
    case 'member':
      return { ctx: await authorise(await currentUser(), String(params.workspace ?? ''), spec.role) };
    case 'user': {
      const user = await currentUser();
      if (!user) throw unauthenticatedError();
      return { user };
    }
    case 'token':
      return { ctx: await authenticateToken(req) };
    case 'public':
      return {};
  }
}

// JSON and empty answers are data, never a document: nothing in them may run or be framed.
// (next.config.mjs sets no policy on these paths, so a handler's own — /api/assets' — stands.)
const API_POLICY = "default-src 'none'; frame-ancestors 'none'";

function withApiPolicy(res: Response): Response {
  if (res.headers.has('content-security-policy') || /html/i.test(res.headers.get('content-type') ?? '')) return res;
  try {
    res.headers.set('content-security-policy', API_POLICY);
    return res;
  } catch {
    // Response.redirect() and friends have immutable headers: copy them.
    const headers = new Headers(res.headers);
    headers.set('content-security-policy', API_POLICY);
    return new Response(res.body, { status: res.status, statusText: res.statusText, headers });
  }
}

function toResponse(out: unknown): Response {
  if (out instanceof Response) return out;
  if (out instanceof Reply) {
    if (out.body === null) return new NextResponse(null, { status: out.status, headers: out.headers });
    return NextResponse.json(out.body, { status: out.status, headers: out.headers });
  }
  return NextResponse.json(out ?? null);
}

const specs = new WeakMap<object, RouteSpec>();
/** The spec an exported method was made with, if `route()` made it (the isolation test checks every one). */
export const routeSpec = (fn: unknown): RouteSpec | undefined => (typeof fn === 'function' ? specs.get(fn) : undefined);

/** The body limit of a route's writes: its own, or the JSON default. */
export const bodyLimitOf = (spec: RouteSpec) => spec.body?.maxBytes ?? BODY_LIMITS.json;

/** Header checks of a write, before the caller is resolved: origin, then type and declared size. */
function checkWriteHeaders(spec: RouteSpec, req: Request) {
  if (!spec.anyOrigin && spec.auth !== 'token') checkSameOrigin(req.headers);
  checkDeclaredLength(req.headers, bodyLimitOf(spec));
}

/** The request with its body read under the route's limit (and of a type it declares). */
async function boundedRequest(spec: RouteSpec, req: NextRequest): Promise<NextRequest> {
  const bytes = await readBounded(req.body, bodyLimitOf(spec));
  checkBodyType(req.headers, spec.body?.types ?? ['application/json'], bytes.byteLength);
  return new NextRequest(req.url, { method: req.method, headers: req.headers, body: bytes.byteLength ? bytes : undefined, signal: req.signal });
}

/** The one route-handler wrapper (see the header). */
export function route<P extends Params = Params, const A extends RouteAuth = RouteAuth, Out = unknown>(
  spec: A & RouteOptions,
  handler: (input: RouteInput<A, P>) => Promise<Out>,
): RouteHandler<Out> {
  const run = async (request: Request, routeCtx?: { params: Promise<RawParams> }): Promise<Response> => {
    try {
      // Opening the context can itself fail (the database not reachable yet): same error shape.
      const write = !isSafeMethod(request.method);
      if (write) checkWriteHeaders(spec, request);
      return withApiPolicy(await withRequestContext(async () => {
        let req = request instanceof NextRequest ? request : new NextRequest(request);
        const raw = (await routeCtx?.params) ?? {};
        const params: Params = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v.join('/') : v]));
        const caller = await resolveCaller(spec, req, params);
        if (write) req = await boundedRequest(spec, req);
        return toResponse(await handler({ req, params, ...caller } as RouteInput<A, P>));
      }));
    } catch (err) {
      return withApiPolicy(toErrorResponse(err));
    }
  };
  specs.set(run, spec);
  return run as RouteHandler<Out>;
}

