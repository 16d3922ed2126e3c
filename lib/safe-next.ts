// Where to go after sign-in when the URL asks (`?next=`): only a path of this site. The value is
// resolved as a URL against the site's own origin and kept only if it stays on that origin, so
// the tricks that make a "path" leave the site — `//host`, `/\host`, `/%09/host` (a tab the
// browser drops, leaving `//host`), `/%5Chost`, `javascript:`, encoded controls — all fall back
// to the default. What is returned is the resolved path, search and hash, never the raw input.
// Tests: tests/unit/safe-next.test.ts.

/** Any origin stands for "ours": only sameness matters, and the answer is a path. */
const SELF = 'https://notchwise.invalid';

// Controls (tab, CR, LF… which browsers strip from URLs) and backslashes (read as slashes).
const TRICKY = /[\u0000-\u001f\u007f\\]/;

function decodedAll(s: string): string | null {
  let cur = s;
  for (let i = 0; i < 3; i++) {
    let next: string;
    try {
      next = decodeURIComponent(cur);
    } catch {
      return null;
    }
    if (next === cur) return cur;
    cur = next;
  }
  return cur;
}

/** The same-origin path to follow, or null for the default. */
export function safeNextPath(next: string | null | undefined, origin: string = SELF): string | null {
  if (typeof next !== 'string' || next.length === 0 || next.length > 2000) return null;
  if (!next.startsWith('/') || TRICKY.test(next)) return null;
  const decoded = decodedAll(next);
  if (decoded === null || TRICKY.test(decoded) || decoded.startsWith('//')) return null;
  let url: URL;
  let base: URL;
  try {
    base = new URL(origin);
    url = new URL(next, base);
  } catch {
    return null;
  }
  if (url.origin !== base.origin) return null;
  const path = `${url.pathname}${url.search}${url.hash}`;
  // Path normalisation (`/./`, `/../`) may bring a leading `//` back, plainly or encoded.
  const again = decodedAll(path);
  return again === null || again.startsWith('//') || TRICKY.test(again) ? null : path;
}
