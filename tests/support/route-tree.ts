// The app's route handlers and server actions, found on disk at test time, so that a route or
// action added later is covered by the isolation tests without anyone listing it.
// tests/integration/tenant-isolation.test.ts calls every method signed out (401), as another
// workspace's owner (404/403), with A's ids under B's slug (404) and as a viewer on mutations
// (403). A new route under /api/w/[workspace]/… needs nothing; a new dynamic segment needs a
// value in ./tenant-fixture.ts (the test names it); a new public route or action needs an
// allow-list entry in that test, with its reason.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

const ROOT = path.resolve(import.meta.dirname, '../..');

export const HTTP_METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'] as const;
export type HttpMethod = (typeof HTTP_METHODS)[number];
/** Route segment config a route module may export besides its methods. */
const SEGMENT_CONFIG = new Set(['dynamic', 'dynamicParams', 'revalidate', 'fetchCache', 'runtime', 'preferredRegion', 'maxDuration']);

export interface RouteModule {
  /** File path relative to the repository, e.g. app/api/w/[workspace]/route.ts */
  file: string;
  /** URL pattern with route groups removed, e.g. /api/w/[workspace]/studies/[study] */
  pattern: string;
  /** Dynamic segment names in order, e.g. ['workspace', 'study'] */
  params: string[];
  methods: Partial<Record<HttpMethod, (req: unknown, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>>>;
  /** Runtime exports that are neither methods nor segment config: the generator cannot classify them. */
  unknownExports: string[];
}

function walk(dir: string, match: (file: string) => boolean, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    if (name === 'node_modules' || name.startsWith('.')) continue;
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) walk(full, match, out);
    else if (match(full)) out.push(full);
  }
  return out.sort();
}

/** URL pattern of a route file: route groups "(x)" vanish, "[x]" and "[...x]" stay. */
export function patternOf(file: string): string {
  const segs = path.relative(path.join(ROOT, 'app'), path.dirname(file)).split(path.sep).filter((s) => s && !/^\(.*\)$/.test(s));
  return '/' + segs.join('/');
}

export function paramsOf(pattern: string): string[] {
  return [...pattern.matchAll(/\[(?:\.\.\.)?([^\]]+)\]/g)].map((m) => m[1]);
}

/** Every app/**\/route.ts, imported. */
export async function loadRoutes(): Promise<RouteModule[]> {
  const files = walk(path.join(ROOT, 'app'), (f) => /[/\\]route\.(ts|tsx|js|mjs)$/.test(f));
  const out: RouteModule[] = [];
  for (const full of files) {
    const mod = (await import(full)) as Record<string, unknown>;
    const pattern = patternOf(full);
    const methods: RouteModule['methods'] = {};
    const unknownExports: string[] = [];
    for (const [name, value] of Object.entries(mod)) {
      if ((HTTP_METHODS as readonly string[]).includes(name) && typeof value === 'function') methods[name as HttpMethod] = value as never;
      else if (!SEGMENT_CONFIG.has(name)) unknownExports.push(name);
    }
    out.push({ file: path.relative(ROOT, full), pattern, params: paramsOf(pattern), methods, unknownExports });
  }
  return out;
}

export interface ActionModule {
  file: string;
  actions: Record<string, (...args: unknown[]) => Promise<unknown>>;
  /** Exports of a 'use server' file that are not async functions (Next refuses those too). */
  notActions: string[];
}

const isUseServerFile = (full: string) => /\.(ts|tsx)$/.test(full) && /^\s*(\/\/[^\n]*\n\s*)*['"]use server['"]/.test(readFileSync(full, 'utf8'));

/** Every file under app/ and lib/ that starts with 'use server', imported. */
export async function loadActions(): Promise<ActionModule[]> {
  const files = [...walk(path.join(ROOT, 'app'), isUseServerFile), ...walk(path.join(ROOT, 'lib'), isUseServerFile)];
  const out: ActionModule[] = [];
  for (const full of files) {
    const mod = (await import(full)) as Record<string, unknown>;
    const actions: ActionModule['actions'] = {};
    const notActions: string[] = [];
    for (const [name, value] of Object.entries(mod)) {
      if (typeof value === 'function') actions[name] = value as never;
      else notActions.push(name);
    }
    out.push({ file: path.relative(ROOT, full), actions, notActions });
  }
  return out;
}

/** Parameter names of a function, read from its source (for plausible arguments). */
export function parameterNames(fn: (...args: never[]) => unknown): string[] {
  const src = fn.toString();
  const m = /^[^(]*\(([^)]*)\)/.exec(src);
  if (!m) return [];
  return m[1].split(',').map((p) => p.replace(/[=:].*$/s, '').replace(/[{}[\]\s.]/g, '')).filter(Boolean);
}
