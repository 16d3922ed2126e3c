// Shared pieces of the property-based fuzz tests (fast-check).
import fc from 'fast-check';
import { expect } from 'vitest';
import { em } from '@/lib/server/db/orm';

/** Values of the wrong type, out of range, or awkward: what a hostile client sends in a field. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer(),
  fc.double(),
  fc.string(),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.boolean(),
  fc.constant(null),
  fc.constantFrom(-1, -0, 0.5, 1e308, -1e308, Number.MAX_SAFE_INTEGER, 2 ** 31, 2 ** 53 + 1),
  fc.constantFrom('', ' ', '0', '1e9', 'NaN', '__proto__', "'; drop table trial; --", '\u0000', 'x'.repeat(5000)),
  fc.array(fc.integer(), { maxLength: 4 }),
  fc.object({ maxDepth: 2, maxKeys: 4 }),
);

/** A refusal: 4xx, the JSON error shape, a message someone can read. Never a 5xx. */
export async function expectCleanResponse(res: Response): Promise<unknown> {
  expect(res.status, `unexpected ${res.status}`).toBeLessThan(500);
  if (res.status < 400) return res.json().catch(() => null);
  const body = await res.json();
  expect(body).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
  expect(body.error.message.trim().length).toBeGreaterThan(0);
  return body;
}

export async function countRows(sql: string, args: unknown[]): Promise<number> {
  const rows = await (await em()).getConnection().execute<{ n: number }[]>(sql, args);
  return Number(rows[0].n);
}

/** Runs kept modest so the suite stays fast; FUZZ_RUNS raises them for a longer local hunt. */
export const fuzzRuns = (n: number) => Number(process.env.FUZZ_RUNS ?? n);
