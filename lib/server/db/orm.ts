import 'server-only';
// The one way to reach the database. `em()` is the request's EntityManager: the route and
// action wrappers (lib/server/http) and the job worker open a MikroORM RequestContext, and a
// server component render gets one fork shared by everything it calls (React's `cache`).
// Outside all three (scripts, tests) each call forks a fresh one. Raw SQL goes through
// `sql()` in ./sql.ts, which joins the same EntityManager's transaction.
import { cache } from 'react';
import { MikroORM, RequestContext, type EntityManager } from '@mikro-orm/postgresql';
import config from '@/mikro-orm.config';
import { env } from '@/lib/server/platform/env';

export type { EntityManager };

type OrmHolder = { ormPromise?: Promise<MikroORM> };
const holder = globalThis as unknown as OrmHolder;

/** One ORM per process: the init promise is cached so concurrent first calls share it. */
export function orm(): Promise<MikroORM> {
  holder.ormPromise ??= MikroORM.init({ ...config, clientUrl: env().DATABASE_URL }).catch((err) => {
    holder.ormPromise = undefined;
    throw err;
  });
  return holder.ormPromise;
}

const renderFork = cache(async (): Promise<EntityManager> => (await orm()).em.fork());

/** The current request's EntityManager (see the header). */
export async function em(): Promise<EntityManager> {
  const scoped = RequestContext.getEntityManager();
  if (scoped) return scoped as EntityManager;
  return renderFork();
}

/** Runs `fn` with its own request-scoped EntityManager (route handlers, actions, jobs). */
export async function withRequestContext<T>(fn: () => Promise<T>): Promise<T> {
  const { em } = await orm();
  return RequestContext.create(em, fn);
}
