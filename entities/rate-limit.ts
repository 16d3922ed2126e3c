import { defineEntity, type InferEntity } from '@mikro-orm/core';

/**
 * Counters of rate-limiter-flexible's RateLimiterPostgres (lib/server/rate-limit.ts), kept in
 * the database so every app instance shares them. The library reads and writes the rows with
 * its own SQL; the columns match what it would create itself (we pass tableCreated: true).
 */
export const RateLimit = defineEntity({
  name: 'RateLimit',
  tableName: 'rate_limit',
  properties: (p) => ({
    key: p.string().length(255).primary(),
    points: p.integer().default(0),
    /** Epoch milliseconds when the window ends. */
    expire: p.bigint().nullable(),
  }),
});
export type IRateLimit = InferEntity<typeof RateLimit>;
