import 'server-only';
import { notFoundError } from '@/lib/server/http/errors';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Ids from a URL are checked before they reach a query, so a malformed one is a 404, not a 500. */
export const isUuid = (v: string) => UUID.test(v);

export function requireUuid(id: string, what: string): void {
  if (!isUuid(id)) throw notFoundError(what);
}
