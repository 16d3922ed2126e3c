import { afterEach, beforeAll, describe, expect, expectTypeOf, it, vi } from 'vitest';
import { NextRequest } from 'next/server';
import { z } from 'zod';
import { RequestContext } from '@mikro-orm/postgresql';
import { em } from '@/lib/server/db/orm';
import { Membership } from '@/entities/membership';
import { noContent, readJson, reply, route, routeSpec, type RouteDto } from '@/lib/server/http/route';
import { download } from '@/lib/server/http/download';
import { AppError } from '@/lib/server/http/errors';
import { authorise } from '@/lib/server/team/membership';
import { createApiToken, revokeApiToken } from '@/lib/server/team/access-tokens';
import type { SessionUser } from '@/lib/server/team/session';
import type { Role } from '@/lib/roles';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';

// Protects the one HTTP boundary (lib/server/http/route.ts): who may call (session member,
// signed-in user, access token, public), what a handler's result becomes (DTO → 200 JSON,
// reply() statuses, files passed through) and the one error shape, with nothing internal
// leaking from an unexpected error. Handlers here are made for the test, so each case checks
// the wrapper alone, not a particular route.

const asAnalyst = route({ auth: 'member', role: 'analyst' }, async ({ ctx }) => ({ slug: ctx.workspace.slug, role: ctx.role, user: ctx.user.id }));
const asUser = route({ auth: 'user' }, async ({ user }) => ({ id: user.id }));
const asToken = route({ auth: 'token' }, async ({ ctx }) => ({ workspace: ctx.workspace.slug, role: ctx.role, user: ctx.user.id }));
const asPublic = route({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, async ({ params }) => ({ hello: 'world', params }));

describe('route(): who may call', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let other: Awaited<ReturnType<typeof makeWorkspace>>;
  let viewer: SessionUser;
  let analyst: SessionUser;
  beforeAll(async () => {
    ws = await makeWorkspace();
    other = await makeWorkspace();
    viewer = await makeMember(ws.slug, 'viewer');
    analyst = await makeMember(ws.slug, 'analyst');
  });
  const member = () => callRoute(asAnalyst, { params: { workspace: ws.slug } });

  it('member: signed out is 401 in the one error shape', async () => {
    signInAs(null);
    const res = await member();
    expect(res.status).toBe(401);
    expect(await res.json()).toEqual({ error: { code: 'unauthenticated', message: 'Sign in first.' } });
  });

  it("member: another workspace's owner gets 404, as if the workspace did not exist", async () => {
    signInAs(other.owner);
    const res = await member();
    expect(res.status).toBe(404);
    expect((await res.json()).error.code).toBe('not_found');
  });

  it('member: a weaker role gets 403; the required role and above get the DTO', async () => {
    signInAs(viewer);
    const refused = await member();
    expect(refused.status).toBe(403);
    expect((await refused.json()).error.code).toBe('forbidden');
    for (const [user, role] of [[analyst, 'analyst'], [ws.owner, 'owner']] as const) {
      signInAs(user);
      const ok = await member();
      expect(ok.status).toBe(200);
      expect(await ok.json()).toEqual({ slug: ws.slug, role, user: user.id });
    }
  });

  it('user: signed out 401, signed in the handler sees who', async () => {
    signInAs(null);
    expect((await callRoute(asUser, { params: {} })).status).toBe(401);
    signInAs(viewer);
    expect(await (await callRoute(asUser, { params: {} })).json()).toEqual({ id: viewer.id });
  });

  it('public: runs with nobody signed in; a catch-all segment arrives joined by "/"', async () => {
    signInAs(null);
    const res = await asPublic(new NextRequest('http://127.0.0.1/x/a/b'), { params: Promise.resolve({ rest: ['a', 'b'] }) });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ hello: 'world', params: { rest: 'a/b' } });
  });

  it('every handler records its spec, so the isolation test can check each route', () => {
    expect(routeSpec(asAnalyst)).toEqual({ auth: 'member', role: 'analyst' });
    expect(routeSpec(asPublic)).toMatchObject({ auth: 'public', reason: expect.stringMatching(/probe/) });
    expect(routeSpec(async () => new Response())).toBeUndefined();
  });

  describe('token', () => {
    const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
    const withToken = (headers: Record<string, string>) => callRoute(asToken, { params: {}, headers });
    afterEach(() => signInAs(null));

    it('no header, a malformed header or an unknown token: 401 asking for a bearer token', async () => {
      signInAs(ws.owner); // a session does not stand in for a token
      for (const headers of [{}, { authorization: 'Basic abc' }, bearer('nw_not-a-real-token')]) {
        const res = await withToken(headers);
        expect(res.status).toBe(401);
        expect(res.headers.get('www-authenticate')).toBe('Bearer');
        expect((await res.json()).error.code).toBe('unauthenticated');
      }
    });

    it("accepted: the token's own workspace, as a viewer even when its user is the owner", async () => {
      const ctx = await authorise(ws.owner, ws.slug, 'analyst');
      const { token } = await createApiToken(ctx, 'wrapper test');
      const res = await withToken(bearer(token));
      expect(res.status).toBe(200);
      expect(await res.json()).toEqual({ workspace: ws.slug, role: 'viewer', user: ws.owner.id });
    });

    it('revoked: 401', async () => {
      const ctx = await authorise(analyst, ws.slug, 'analyst');
      const t = await createApiToken(ctx, 'to revoke');
      expect((await withToken(bearer(t.token))).status).toBe(200);
      await revokeApiToken(ctx, t.id);
      expect((await withToken(bearer(t.token))).status).toBe(401);
    });

    it('refused once its user is no longer a member (the same membership check as a session)', async () => {
      const leaver = await makeMember(ws.slug, 'analyst');
      const t = await createApiToken(await authorise(leaver, ws.slug, 'analyst'), 'leaver');
      expect((await withToken(bearer(t.token))).status).toBe(200);
      await (await em()).nativeDelete(Membership, { user: leaver.id });
      const res = await withToken(bearer(t.token));
      expect(res.status).toBe(401);
      expect(JSON.stringify(await res.json())).not.toContain(ws.slug);
    });
  });
});

describe('route(): what a handler returns', () => {
  const run = <T>(fn: () => Promise<T>, init?: { method?: string; rawBody?: string }) =>
    callRoute(route({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, fn), { params: {}, ...init });

  it('a DTO is 200 JSON', async () => {
    const res = await run(async () => ({ items: [1, 2], name: 'x' }));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^application\/json/);
    expect(await res.json()).toEqual({ items: [1, 2], name: 'x' });
  });

  it('reply() sets the status and headers; noContent() is an empty 204', async () => {
    const created = await run(async () => reply({ id: 'a' }, 201, { 'cache-control': 'no-store' }));
    expect(created.status).toBe(201);
    expect(created.headers.get('cache-control')).toBe('no-store');
    expect(await created.json()).toEqual({ id: 'a' });
    const pending = await run(async () => reply({ pending: true }, 202, { 'retry-after': '5' }));
    expect([pending.status, pending.headers.get('retry-after')]).toEqual([202, '5']);
    const none = await run(async () => noContent());
    expect(none.status).toBe(204);
    expect(await none.text()).toBe('');
  });

  it('a file passes through untouched, with a safe name and no caching', async () => {
    const res = await run(async () => download({ filename: 'a b/../c.csv', contentType: 'text/csv; charset=utf-8', body: 'x,y\r\n1,2\r\n' }));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="a-b-..-c.csv"');
    expect(res.headers.get('cache-control')).toBe('no-store');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(await res.text()).toBe('x,y\r\n1,2\r\n');
  });

  it('an AppError becomes its status, code, message, field issues and headers', async () => {
    const res = await run(async () => {
      throw new AppError(409, 'conflict', 'That name is taken.', [{ path: 'name', message: 'Choose another name.' }], { 'x-probe': '1' });
    });
    expect(res.status).toBe(409);
    expect(res.headers.get('x-probe')).toBe('1');
    expect(await res.json()).toEqual({ error: { code: 'conflict', message: 'That name is taken.', issues: [{ path: 'name', message: 'Choose another name.' }] } });
  });

  it('a ZodError is a 422 naming each field; malformed JSON a 400', async () => {
    const schema = z.object({ name: z.string().min(3, 'At least 3 characters.'), size: z.number() });
    const invalid = await run(async () => schema.parse({ name: 'x', size: 'big' }));
    expect(invalid.status).toBe(422);
    const body = await invalid.json();
    expect(body.error.code).toBe('validation_failed');
    expect(body.error.issues).toEqual(expect.arrayContaining([{ path: 'name', message: 'At least 3 characters.' }, expect.objectContaining({ path: 'size' })]));
    let reached = false;
    const bad = await callRoute(route({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, async ({ req }) => {
      await readJson(req, schema);
      reached = true;
      return {};
    }), { method: 'POST', params: {}, rawBody: '{"name": ' });
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.message).toMatch(/not valid JSON/);
    expect(reached).toBe(false);
  });

  it('an unexpected error is a 500 that says nothing of what went wrong inside', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    try {
      const res = await run(async () => {
        throw new Error('relation "secret_table" does not exist at postgres://admin:hunter2@db');
      });
      expect(res.status).toBe(500);
      const text = await res.text();
      expect(JSON.parse(text)).toEqual({ error: { code: 'internal', message: 'Something went wrong on our side. Try again in a moment.' } });
      expect(text).not.toMatch(/secret_table|hunter2|postgres|stack/);
      expect(log).toHaveBeenCalled();
    } finally {
      log.mockRestore();
    }
  });

  it('each request gets its own EntityManager, the same one throughout the handler', async () => {
    const seen: unknown[] = [];
    const probe = route({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, async () => {
      const a = await em();
      seen.push(a);
      return { scoped: RequestContext.getEntityManager() === a, same: a === (await em()) };
    });
    expect(await (await callRoute(probe, { params: {} })).json()).toEqual({ scoped: true, same: true });
    await callRoute(probe, { params: {} });
    expect(seen[0]).not.toBe(seen[1]);
  });
});

describe('RouteDto: clients type a response from the handler itself', () => {
  it('is the DTO, a reply() body unwrapped, a file adding nothing (checked by the type checker, and the body matches at run time)', async () => {
    const handler = route({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, async ({ req }) =>
      req.nextUrl.searchParams.has('file') ? download({ filename: 'a.csv', contentType: 'text/csv', body: '' }) : reply({ id: 'a' }, 201));
    expectTypeOf<RouteDto<typeof handler>>().toEqualTypeOf<{ id: string }>();
    expectTypeOf<RouteDto<typeof asAnalyst>>().toEqualTypeOf<{ slug: string; role: Role; user: string }>();
    const empty = route({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, async () => noContent());
    expectTypeOf<RouteDto<typeof empty>>().toBeNever();
    const body: RouteDto<typeof handler> = await (await callRoute(handler, { params: {} })).json();
    expect(body).toEqual({ id: 'a' });
    expect((await callRoute(empty, { params: {} })).status).toBe(204);
  });
});
