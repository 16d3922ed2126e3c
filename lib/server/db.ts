import 'server-only';
import { MikroORM, type EntityManager } from '@mikro-orm/postgresql';
import config from '@/mikro-orm.config';
import { env } from './env';

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

/** A fresh EntityManager for one request or job. */
export async function em(): Promise<EntityManager> {
  return (await orm()).em.fork();
}
