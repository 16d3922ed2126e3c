/** The error a route handler sent back, in the project's one error shape. */
export class ApiRequestError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly issues?: { path: string; message: string }[],
  ) {
    super(message);
  }
}

/** fetch + JSON for client code; non-2xx answers throw ApiRequestError with the server's message. */
export async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  const res = await fetch(url, { ...init, headers: { accept: 'application/json', ...(init?.body ? { 'content-type': 'application/json' } : {}), ...init?.headers } });
  const body = await res.json().catch(() => null);
  if (!res.ok) {
    const e = body?.error;
    throw new ApiRequestError(res.status, e?.code ?? 'http_error', e?.message ?? `Request failed (${res.status}).`, e?.issues);
  }
  return body as T;
}
