import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { beforeAll, describe, it } from 'vitest';
import { POST as answer } from '@/app/api/r/[token]/answer/route';
import { callRoute, makeWorkspace } from '../support/factories';
import { makeLiveStudy } from '../support/respondent-fixtures';
import { startOk, type Started } from '../support/respondent-client';
import { countRows, expectCleanResponse, fuzzRuns, hostileValue } from '../support/fuzz';
import { expect } from 'vitest';

// POST /api/r/[token]/answer with arbitrary payloads: never a 500, every refusal a clear 4xx,
// and a refused payload writes nothing (trial rows and the respondent's counter unchanged).

const answerish = fc
  .tuple(
    fc.record(
      {
        clientId: fc.oneof(fc.uuid(), hostileValue),
        idx: fc.oneof(fc.integer({ min: -3, max: 80 }), hostileValue),
        answer: fc.oneof(fc.integer({ min: -2, max: 9 }), hostileValue),
        responseMs: fc.oneof(fc.nat(10_000), hostileValue),
      },
      { requiredKeys: [] },
    ),
    fc.dictionary(fc.string({ maxLength: 12 }), hostileValue, { maxKeys: 3 }),
  )
  .map(([a, extra]) => ({ ...extra, ...a }));

const body = fc.oneof(
  { weight: 5, arbitrary: answerish.map((b) => ({ json: b })) },
  { weight: 2, arbitrary: fc.jsonValue().map((b) => ({ json: b })) },
  { weight: 1, arbitrary: fc.string({ maxLength: 200 }).map((raw) => ({ raw })) },
);

describe('fuzz: the answer payload', () => {
  let token: string;
  let s: Started;
  beforeAll(async () => {
    const ws = await makeWorkspace();
    ({ token } = await makeLiveStudy(ws.slug));
    s = await startOk(token, { consent: true, segmentAnswers: { household: '2' } });
  });
  const trials = () => countRows('select count(*)::int as n from trial t join respondent r on r.id = t.respondent_id where r.resume_token = ?', [s.resumeToken]);
  const counter = () => countRows('select answered_count as n from respondent where resume_token = ?', [s.resumeToken]);

  it('arbitrary JSON and raw text: no 5xx, clear 4xx refusals, nothing written when refused', async () => {
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const [t0, c0] = [await trials(), await counter()];
        const res = await callRoute(answer, {
          method: 'POST', params: { token }, headers: { 'x-resume-token': s.resumeToken },
          ...('raw' in b ? { rawBody: b.raw } : { rawBody: JSON.stringify(b.json) ?? 'null' }),
        });
        await expectCleanResponse(res);
        const [t1, c1] = [await trials(), await counter()];
        if (res.status >= 400) {
          expect(t1).toBe(t0);
          expect(c1).toBe(c0);
        } else {
          expect(t1 - t0).toBeLessThanOrEqual(1);
          expect(c1).toBe(t1);
        }
      }),
      { numRuns: fuzzRuns(200) },
    );
  });

  it('a valid answer mutated in one field: no 5xx, at most one row per accepted answer', async () => {
    const fields = ['clientId', 'idx', 'answer', 'responseMs'] as const;
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...fields), hostileValue, fc.boolean(), async (field, value, drop) => {
        const t = s.upcoming[0];
        const valid: Record<string, unknown> = { clientId: randomUUID(), idx: t.idx, answer: 1, responseMs: 700 };
        if (drop) delete valid[field];
        else valid[field] = value;
        const t0 = await trials();
        const res = await callRoute(answer, { method: 'POST', params: { token }, headers: { 'x-resume-token': s.resumeToken }, rawBody: JSON.stringify(valid) });
        await expectCleanResponse(res);
        if (res.status >= 400) expect(await trials()).toBe(t0);
      }),
      { numRuns: fuzzRuns(100) },
    );
  });
});
