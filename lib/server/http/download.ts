import 'server-only';
// Files leave the app through here. Data-access functions return a `FileDownload` (plain
// data: a name, a type and the bytes) and the route handler turns it into the one kind of
// response the wrapper passes through untouched, so the data layer never builds a Response
// and every download gets the same safe headers.
import { reply } from './route';

export interface FileDownload {
  filename: string;
  contentType: string;
  body: string | Uint8Array;
}

export const csvFile = (filename: string, body: string): FileDownload => ({ filename, contentType: 'text/csv; charset=utf-8', body });
export const jsonFile = (filename: string, data: unknown): FileDownload => ({ filename, contentType: 'application/json; charset=utf-8', body: JSON.stringify(data) });

/**
 * A download response: `attachment` unless shown in place; uncached unless told. The type is
 * never sniffed and the file may run nothing, should a browser open it as a page.
 */
export function download(file: FileDownload, opts: { inline?: boolean; cacheControl?: string } = {}): Response {
  const name = file.filename.replace(/[^A-Za-z0-9._-]/g, '-');
  const bytes = typeof file.body === 'string' ? new TextEncoder().encode(file.body) : new Uint8Array(file.body);
  return new Response(bytes, {
    headers: {
      'content-type': file.contentType,
      'content-length': String(bytes.byteLength),
      'content-disposition': `${opts.inline ? 'inline' : 'attachment'}; filename="${name}"`,
      'cache-control': opts.cacheControl ?? 'no-store',
      'x-content-type-options': 'nosniff',
      'content-security-policy': "default-src 'none'",
    },
  });
}

/** A file that is still being computed: the client is told to come back (202 + Retry-After). */
export interface PendingFile {
  status: 'pending';
  message: string;
  retryAfterSeconds: number;
}

/** The route's answer for a file that may still be pending: the file, or 202 `{ status, message }`. */
export function downloadOrPending(out: FileDownload | PendingFile) {
  if ('status' in out) return reply({ status: out.status, message: out.message }, 202, { 'retry-after': String(out.retryAfterSeconds) });
  return download(out);
}
