import 'server-only';
// What route() checks about a request that changes something (any method but GET, HEAD and
// OPTIONS) before its handler sees it: where it came from, what kind of body it carries, and
// how big that body is. One place, so no route can forget it.
//
// - Cross-site writes. A page on another site — or on another port of this host, which is
//   the same *site* but another *origin* — can make a signed-in browser send a POST with its
//   cookies. Browsers say where a request comes from: `Sec-Fetch-Site` (same-origin, same-site,
//   cross-site, none), and `Origin` on every non-GET request (Fetch standard). A request whose
//   Sec-Fetch-Site is anything but same-origin (or none: typed by the user), or whose Origin is
//   neither APP_URL's origin nor the Host it was sent to, is refused with 403 before anything
//   runs. A request with neither header did not come from a browser page, so it carries no
//   cookie a page could have lent it; it passes (the same rule Next.js applies to server
//   actions, and Go's net/http CrossOriginProtection). Exempt: routes that declare
//   `anyOrigin` with their reason (the Stripe webhook, authenticated by its signature) and
//   token routes (a bearer token is never attached by a browser on its own).
// - Body type. The body must be one of the types the route declares (JSON unless it says
//   otherwise), so a `text/plain` form post — the "simple request" that needs no CORS
//   preflight — cannot reach a JSON handler. A bodiless request may leave the type out.
// - Body size. The limit is enforced while the body streams in, chunked or not: a declared
//   Content-Length over the limit is refused before a byte is read, and a stream is read only
//   until it passes the limit, then left unread; 413 in the one error shape. The handler then
//   reads the buffered copy (`req.json()`, `req.formData()`, `req.text()` as before).
// Tests: tests/integration/http-request-guard.test.ts; the isolation test sends every non-GET
// route a cross-site request.
import { AppError } from './errors';
import { env } from '@/lib/server/platform/env';

/** Per-route body limits in bytes (uploads state their own: their documented cap plus framing). */
export const BODY_LIMITS = {
  /** Any JSON body unless the route says otherwise. */
  json: 64 * 1024,
  /** Respondent calls: an answer batch is at most 32 answers of ~120 bytes. */
  respondent: 16 * 1024,
  /** A study design (every text at its longest stays far below this). */
  design: 256 * 1024,
  /** Auth.js's own form posts (sign-in, sign-out). */
  authForm: 16 * 1024,
  /** Stripe's webhook events (Stripe's own are a few kB). */
  webhook: 1024 * 1024,
} as const;

export interface BodyRule {
  /** Media types accepted (without parameters), e.g. 'application/json', 'multipart/form-data'. */
  types?: readonly string[];
  /** The largest body accepted, in bytes. */
  maxBytes?: number;
}

/** What a route declares beyond who may call it. */
export interface RouteOptions {
  body?: BodyRule;
  /** Accept writes from any origin; the reason says what authenticates them instead. */
  anyOrigin?: string;
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
export const isSafeMethod = (method: string) => SAFE_METHODS.has(method.toUpperCase());

const crossSite = () => new AppError(403, 'cross_site', 'This request came from another site. Use Notchwise itself to make this change.');

function appOrigin(): string | null {
  try {
    return new URL(env().APP_URL).origin;
  } catch {
    return null;
  }
}

/** Refuses a write a browser sent from a page of another origin (see the header). */
export function checkSameOrigin(headers: Headers): void {
  const site = headers.get('sec-fetch-site')?.toLowerCase();
  if (site) {
    if (site === 'same-origin' || site === 'none') return;
    throw crossSite();
  }
  const origin = headers.get('origin');
  if (origin === null) return;
  if (origin === appOrigin()) return;
  let host: string | null = null;
  try {
    host = origin === 'null' ? null : new URL(origin).host;
  } catch {
    host = null;
  }
  if (host !== null && host === headers.get('host')) return;
  throw crossSite();
}

const mediaType = (contentType: string | null) => (contentType ?? '').split(';')[0].trim().toLowerCase();

/** Refuses a body of a type the route does not take (415); a bodiless request may omit the type. */
export function checkBodyType(headers: Headers, types: readonly string[], bodyBytes: number): void {
  const type = mediaType(headers.get('content-type'));
  if (!type && bodyBytes === 0) return;
  if (types.includes(type)) return;
  const names = types.join(' or ');
  throw new AppError(415, 'unsupported_media_type', `Send the body as ${names}.`);
}

export const tooLargeError = (maxBytes: number) =>
  new AppError(413, 'payload_too_large', `The request is larger than ${formatBytes(maxBytes)}, the most accepted here.`);

/** Rounded down, so an upload's cap plus its form framing reads as the documented cap. */
function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${Math.floor((n / 1024 / 1024) * 10) / 10} MB`;
  return `${Math.floor(n / 1024)} kB`;
}

/** Refuses a declared Content-Length over the limit, before anything is read. */
export function checkDeclaredLength(headers: Headers, maxBytes: number): void {
  const declared = headers.get('content-length');
  if (declared !== null && Number(declared) > maxBytes) throw tooLargeError(maxBytes);
}

/**
 * The whole body, read chunk by chunk and given up as soon as it passes `maxBytes` (the rest is
 * never read, so memory stays at the limit whatever the sender streams).
 */
export async function readBounded(body: ReadableStream<Uint8Array> | null, maxBytes: number): Promise<Uint8Array<ArrayBuffer>> {
  if (!body) return new Uint8Array(0);
  const reader = body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > maxBytes) throw tooLargeError(maxBytes);
      chunks.push(value);
    }
  } finally {
    // Not cancel(): cancelling destroys the socket under `next start`, and the 413 would never
    // reach the sender. Unread, the socket's flow control stops the sender instead.
    reader.releaseLock();
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}
