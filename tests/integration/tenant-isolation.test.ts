import { randomBytes } from 'node:crypto';
import { beforeAll, describe, expect, it, vi } from 'vitest';

// Actions read the client address and Auth.js cookies from next/headers; give them a request.
vi.mock('next/headers', () => ({
  headers: async () => new Headers({ 'x-forwarded-for': '10.200.0.1' }),
  cookies: async () => ({ get: () => undefined, getAll: () => [], has: () => false, set: () => undefined, delete: () => undefined }),
}));

import { AppError } from '@/lib/server/http/errors';
import { routeSpec, type RouteAuth } from '@/lib/server/http/route';
import { actionGuard } from '@/lib/server/http/action';
import { callRoute, signInAs } from '../support/factories';
import { loadActions, loadRoutes, parameterNames, type HttpMethod, type RouteModule } from '../support/route-tree';
import { countsOf, makeTenantFixture, type TenantFixture } from '../support/tenant-fixture';

// Generated from the route tree: every route.ts under app/ and every 'use server' file under
// app/ and lib/ is found and imported at test time, so a new one is covered automatically.
// Each exported method must be made by route() and each action by action(), with the guard
// the route's place in the tree calls for.

/** Routes outside /api/w/[workspace] that are public by design, each with its reason. */
const PUBLIC_ROUTES: { pattern: RegExp; reason: string }[] = [
  { pattern: /^\/api\/auth\/\[\.\.\.nextauth\]$/, reason: 'Auth.js sign-in/out endpoints; rate-limited, no workspace data' },
  { pattern: /^\/r\/\[token\](\/.*)?$/, reason: 'the respondent runtime (link, flow document, start, state, complete, picture): the unguessable link token (and resume token) is the credential, no session' },
  { pattern: /^\/r-assets\/\[file\]$/, reason: "the respondent bundle's static files (hashed names only), no data" },
  { pattern: /^\/api\/stripe\/webhook$/, reason: 'Stripe webhook: authenticated by its signature header' },
  { pattern: /^\/api\/assets\/\[id\]$/, reason: 'item pictures by random id, shown to respondents without a session' },
  { pattern: /^\/api\/v1(\/.*)?$/, reason: 'read-only export API: bearer-token based, tested separately below' },
];
/** Routes for any signed-in user (no workspace in the URL). */
const USER_ROUTES: { pattern: RegExp; reason: string }[] = [
  { pattern: /^\/api\/me$/, reason: "the caller's own account and memberships" },
];
/** Route files that answer without route(), each with its reason; none may hold workspace data. */
const UNWRAPPED_ROUTES: { pattern: RegExp; reason: string }[] = [
];
/** Server actions anyone may call, each with its reason; every other action must refuse an outsider. */
const PUBLIC_ACTIONS: Record<string, string> = {
  'app/(auth)/actions.ts#signUpAction': 'creates a new account and its own new workspace; touches no existing one',
  'app/(auth)/actions.ts#signOutAction': "ends the caller's own session",
  'app/(auth)/reset/actions.ts#requestResetAction': 'answers the same for every address; the link goes only to the mailbox',
  'app/(auth)/confirm/actions.ts#resendConfirmationAction': "sends a confirmation link to the caller's own address, if it still waits",
};

/** Query strings for reads that validate their query before looking anything up. */
const QUERY: Record<string, string> = {
  '/api/w/[workspace]/studies/[study]/planner': '?width=2',
  '/api/w/[workspace]/studies/[study]/results/segments': '?question=shop_often',
};

const WORKSPACE = /^\/api\/w\/\[workspace\](\/|$)/;
const TOKEN_API = /^\/api\/v1(\/|$)/;
type Kind = 'workspace' | 'user' | 'public' | 'unclassified';
const classify = (r: RouteModule): Kind =>
  WORKSPACE.test(r.pattern) ? 'workspace' : USER_ROUTES.some((u) => u.pattern.test(r.pattern)) ? 'user' : PUBLIC_ROUTES.some((p) => p.pattern.test(r.pattern)) ? 'public' : 'unclassified';

const routes = await loadRoutes();
const actionModules = await loadActions();
const workspaceRoutes = routes.filter((r) => classify(r) === 'workspace');
const methodsOf = (r: RouteModule) => Object.keys(r.methods) as HttpMethod[];
const isRead = (m: HttpMethod) => m === 'GET' || m === 'HEAD';

let fx: TenantFixture;

function paramsFor(r: RouteModule, slug: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const p of r.params) {
    const v = p === 'workspace' ? slug : fx.params[p];
    if (v === undefined) throw new Error(`${r.file}: no fixture value for the segment [${p}]; add one to tests/support/tenant-fixture.ts`);
    out[p] = v;
  }
  return out;
}

/** A plausible body that names A's objects, so a handler that trusts body ids is caught too. */
const probeBody = () => ({ name: 'Isolation probe', studyId: fx.studyId, priceListId: fx.params.list, linkId: fx.params.link, role: 'owner', email: 'probe@test.example', state: 'closed' });

async function call(r: RouteModule, method: HttpMethod, slug: string) {
  const params = paramsFor(r, slug);
  const url = 'http://127.0.0.1' + r.pattern.replace(/\[(?:\.\.\.)?([^\]]+)\]/g, (_m, p: string) => encodeURIComponent(params[p])) + (QUERY[r.pattern] ?? '');
  return callRoute(r.methods[method]! as never, { method, url, params, body: isRead(method) ? undefined : probeBody() });
}

describe('the route tree is fully classified', () => {
  it('every route module is under /api/w/[workspace], a signed-in user route, or on the public allow-list', () => {
    const unclassified = routes.filter((r) => classify(r) === 'unclassified').map((r) => r.file);
    expect(unclassified, 'add a guard under /api/w/[workspace] or an allow-list entry with its reason').toEqual([]);
    expect(workspaceRoutes.length).toBeGreaterThan(20);
  });

  it('route modules export only HTTP methods and segment config', () => {
    expect(routes.filter((r) => r.unknownExports.length).map((r) => `${r.file}: ${r.unknownExports.join(', ')}`)).toEqual([]);
    expect(routes.filter((r) => methodsOf(r).length === 0).map((r) => r.file)).toEqual([]);
  });

  it('every allow-list entry still matches a route (no stale exceptions)', () => {
    for (const p of [...PUBLIC_ROUTES, ...USER_ROUTES]) expect(routes.some((r) => p.pattern.test(r.pattern)), String(p.pattern)).toBe(true);
  });

  it('every exported method is made by route(), unless its file is on the unwrapped list with a reason', () => {
    const unwrapped = routes.flatMap((r) => methodsOf(r).filter((m) => !routeSpec(r.methods[m])).map((m) => ({ r, m })));
    const unlisted = unwrapped.filter(({ r }) => !UNWRAPPED_ROUTES.some((u) => u.pattern.test(r.pattern))).map(({ r, m }) => `${m} ${r.file}`);
    expect(unlisted, 'wrap the handler in route({ auth, ... }) from lib/server/http/route.ts').toEqual([]);
    for (const u of UNWRAPPED_ROUTES) expect(unwrapped.some(({ r }) => u.pattern.test(r.pattern)), `stale unwrapped entry ${u.pattern}`).toBe(true);
    // The wrapped ones are most of the tree: the check above is not vacuous.
    expect(routes.filter((r) => methodsOf(r).every((m) => routeSpec(r.methods[m]))).length).toBeGreaterThan(workspaceRoutes.length);
  });

  it("each route()'s guard fits its place: member under /api/w/[workspace], user for /api/me, token for /api/v1, public only when allow-listed", () => {
    const expected = (r: RouteModule): RouteAuth['auth'] =>
      classify(r) === 'workspace' ? 'member' : classify(r) === 'user' ? 'user' : TOKEN_API.test(r.pattern) ? 'token' : 'public';
    const wrong: string[] = [];
    for (const r of routes) {
      for (const m of methodsOf(r)) {
        const spec = routeSpec(r.methods[m]);
        if (!spec) continue;
        if (spec.auth !== expected(r)) wrong.push(`${m} ${r.pattern}: auth '${spec.auth}', expected '${expected(r)}'`);
        if (spec.auth === 'public' && spec.reason.trim().length < 10) wrong.push(`${m} ${r.pattern}: a public route needs its reason`);
      }
    }
    expect(wrong).toEqual([]);
  });
});

describe('workspace routes: outsiders, viewers and signed-out callers are refused', () => {
  let before: Record<string, number>;
  beforeAll(async () => {
    fx = await makeTenantFixture();
    before = await countsOf(fx.workspaceId);
  }, 180_000);

  for (const r of workspaceRoutes) {
    for (const m of methodsOf(r)) {
      describe(`${m} ${r.pattern}`, () => {
        it('signed out: 401', async () => {
          signInAs(null);
          expect((await call(r, m, fx.a.slug)).status).toBe(401);
        });

        it("the owner of another workspace, on A's URL: 404/403, never 2xx", async () => {
          signInAs(fx.b.owner);
          const res = await call(r, m, fx.a.slug);
          expect([403, 404]).toContain(res.status);
          expect((await res.json()).error.message).toBeTruthy();
        });

        if (r.params.some((p) => p !== 'workspace' && p !== 'file')) {
          it("the owner of another workspace, with A's ids under their own workspace: refused, never 2xx or 5xx", async () => {
            signInAs(fx.b.owner);
            const res = await call(r, m, fx.b.slug);
            if (isRead(m)) expect(res.status).toBe(404);
            else expect(res.status >= 400 && res.status < 500, `status ${res.status}`).toBe(true);
          });
        }

        it(isRead(m) ? "a viewer of A: allowed or refused, never 5xx; A's owner: not a 404 (the fixture ids are real)" : 'a viewer of A: 403 (or 404)', async () => {
          signInAs(fx.viewer);
          const res = await call(r, m, fx.a.slug);
          if (isRead(m)) {
            expect(res.status, await res.clone().text()).toBeLessThan(500);
            signInAs(fx.a.owner);
            const own = await call(r, m, fx.a.slug);
            expect(own.status, await own.clone().text()).toBeLessThan(400);
          } else {
            expect([403, 404]).toContain(res.status);
          }
        });
      });
    }
  }

  it("after every refused request A's rows are all still there, unchanged", async () => {
    expect(await countsOf(fx.workspaceId)).toEqual(before);
  });

  it('/api/me: signed out 401', async () => {
    signInAs(null);
    for (const r of routes.filter((x) => classify(x) === 'user')) {
      for (const m of methodsOf(r)) expect((await callRoute(r.methods[m]! as never, { method: m, params: {} })).status).toBe(401);
    }
  });
});

/** Routes whose writes may come from any origin, each with what authenticates them instead. */
const ANY_ORIGIN_ROUTES: { pattern: RegExp; reason: string }[] = [
  { pattern: /^\/api\/stripe\/webhook$/, reason: "Stripe's servers post it; its signature over the body is the credential" },
];

describe('every write refuses a cross-site sender (issue 13, finding 2)', () => {
  const writes = routes.flatMap((r) => methodsOf(r).filter((m) => !isRead(m) && m !== 'OPTIONS').map((m) => ({ r, m })));
  let before: Record<string, number>;
  beforeAll(async () => {
    fx ??= await makeTenantFixture();
    before = await countsOf(fx.workspaceId);
  }, 180_000);

  it('the write routes are found, and only allow-listed ones accept any origin', () => {
    expect(writes.length).toBeGreaterThan(20);
    const open = writes.filter(({ r, m }) => routeSpec(r.methods[m])?.anyOrigin).map(({ r, m }) => `${m} ${r.pattern}`);
    expect(open).toEqual(writes.filter(({ r }) => ANY_ORIGIN_ROUTES.some((a) => a.pattern.test(r.pattern))).map(({ r, m }) => `${m} ${r.pattern}`));
    for (const a of ANY_ORIGIN_ROUTES) expect(writes.some(({ r }) => a.pattern.test(r.pattern)), String(a.pattern)).toBe(true);
  });

  for (const { r, m } of writes) {
    if (ANY_ORIGIN_ROUTES.some((a) => a.pattern.test(r.pattern))) continue;
    it(`${m} ${r.pattern}: from a page on another port of this host (same site, text/plain, signed in as A's owner): 403`, async () => {
      signInAs(fx.a.owner);
      // Auth.js's catch-all is the one segment outside the fixture: its credentials sign-in.
      const params = r.params.includes('nextauth') ? { nextauth: 'callback/credentials' } : paramsFor(r, fx.a.slug);
      const url = 'http://127.0.0.1:3000' + r.pattern.replace(/\[(?:\.\.\.)?([^\]]+)\]/g, (_m, p: string) => encodeURIComponent(params[p]));
      const headers = { 'content-type': 'text/plain', 'sec-fetch-site': 'same-site', origin: 'http://127.0.0.1:8080', host: '127.0.0.1:3000' };
      const res = await callRoute(r.methods[m]! as never, { method: m, url, params, rawBody: JSON.stringify(probeBody()), headers });
      expect(res.status, await res.clone().text()).toBe(403);
      expect((await res.json()).error.code).toBe('cross_site');
    });
  }

  it("after every cross-site write A's rows are all still there, unchanged", async () => {
    expect(await countsOf(fx.workspaceId)).toEqual(before);
  });
});

describe('the read-only export API (/api/v1): bearer tokens are scoped to their workspace', () => {
  const v1 = (pattern: string) => routes.find((r) => r.pattern === pattern)!;
  const get = (pattern: string, params: Record<string, string>, token?: string) =>
    callRoute(v1(pattern).methods.GET! as never, { params, headers: token ? { authorization: `Bearer ${token}` } : {} });

  it("no token: 401; B's token cannot read A's study (404) and lists only B's studies", async () => {
    const file = { study: fx.studyId, file: 'trials.csv' };
    expect((await get('/api/v1/studies/[study]/[file]', file)).status).toBe(401);
    expect((await get('/api/v1/studies', {})).status).toBe(401);
    expect((await get('/api/v1/studies/[study]/[file]', file, 'not-a-real-token')).status).toBe(401);
    expect((await get('/api/v1/studies/[study]/[file]', file, fx.tokenB.token)).status).toBe(404);
    const listB = await (await get('/api/v1/studies', {}, fx.tokenB.token)).json();
    expect(JSON.stringify(listB)).not.toContain(fx.studyId);
    // A's own token reads it: the 404 above is isolation, not a bad fixture.
    expect((await get('/api/v1/studies/[study]/[file]', file, fx.tokenA.token)).status).toBeLessThan(300);
  });

  it("the threshold record: no token 401; B's token gets B's record, without A's study", async () => {
    expect((await get('/api/v1/record', {})).status).toBe(401);
    const recordB = await (await get('/api/v1/record', {}, fx.tokenB.token)).text();
    expect(recordB).not.toContain(fx.studyId);
    const recordA = await (await get('/api/v1/record', {}, fx.tokenA.token)).text();
    expect(recordA).toContain(fx.studyId);
  });
});

describe('server actions refuse an outsider', () => {
  const all = actionModules.flatMap((m) => Object.entries(m.actions).map(([name, fn]) => ({ id: `${m.file}#${name}`, fn })));

  it("'use server' files export only async functions, and the public allow-list has no stale entries", () => {
    expect(actionModules.filter((m) => m.notActions.length).map((m) => m.file)).toEqual([]);
    for (const id of Object.keys(PUBLIC_ACTIONS)) expect(all.map((a) => a.id)).toContain(id);
    expect(all.length).toBeGreaterThan(3);
  });

  it('every action is made by action() (one guard), and the allow-listed ones are declared public in code with a reason', () => {
    expect(all.filter((a) => !actionGuard(a.fn)).map((a) => a.id), 'wrap the action in action({ auth, ... }) from lib/server/http/action.ts').toEqual([]);
    for (const id of Object.keys(PUBLIC_ACTIONS)) {
      const spec = actionGuard(all.find((a) => a.id === id)?.fn)?.spec;
      expect(spec?.auth, id).toBe('public');
      expect(spec && spec.auth === 'public' ? spec.reason.length : 0, id).toBeGreaterThan(10);
    }
  });

  /**
   * Arguments by the parameter names of the action's body (after the caller it is handed):
   * A's slug first for member actions, then A's ids, an unknown token, a plausible form.
   */
  function argsFor(exported: (...a: never[]) => unknown): unknown[] {
    const guard = actionGuard(exported);
    const names = guard ? parameterNames(guard.fn).slice(1) : parameterNames(exported);
    const slug = guard?.spec.auth === 'member' ? [fx.a.slug] : [];
    return [...slug, ...names.map((name, i) => {
      const n = name.toLowerCase();
      if (n.includes('slug') || n.includes('workspace')) return fx.a.slug;
      if (n.includes('token')) return randomBytes(32).toString('base64url');
      if (n === 'next') return null;
      const id = Object.entries(fx.params).find(([k]) => n === k || n === `${k}id`);
      if (id) return id[1];
      if (i === 0 && !['input', 'data', 'values', 'form', 'formdata'].includes(n)) return fx.a.slug;
      return { email: fx.a.owner.email, password: 'not-the-password-123', name: 'Outsider', workspaceName: `Outsider ${i}`, role: 'owner', studyId: fx.studyId };
    })];
  }

  for (const { id, fn } of all) {
    if (PUBLIC_ACTIONS[id]) continue;
    it(`${id}: refused (ok:false or AppError 401/403/404)`, async () => {
      signInAs(fx.b.owner);
      let out: unknown;
      try {
        out = await fn(...argsFor(fn));
      } catch (err) {
        expect(err instanceof AppError && [401, 403, 404].includes(err.status), String(err)).toBe(true);
        return;
      }
      expect(out).toMatchObject({ ok: false, message: expect.any(String) });
    });
  }
});
