import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { beforeAll, describe, it } from 'vitest';
import { POST as answers } from '@/app/r/[token]/answers/route';
import { callRoute, makeWorkspace } from '../support/factories';
import { makeLiveStudy } from '../support/respondent-fixtures';
import { startOk, type Started } from '../support/respondent-client';
import { countRows, expectCleanResponse, fuzzRuns, hostileValue } from '../support/fuzz';
import { expect } from 'vitest';

// POST /r/[token]/answers with arbitrary payloads: never a 500, every refusal a clear 4xx, and a
// refused batch writes nothing (trial rows and the respondent's counter unchanged). Protects the
// batch endpoint's promise that one bad answer refuses the whole batch.

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

const batchish = fc
  .tuple(
    fc.oneof(fc.array(answerish, { maxLength: 40 }), hostileValue),
    fc.dictionary(fc.string({ maxLength: 12 }), hostileValue, { maxKeys: 2 }),
    fc.option(hostileValue, { nil: undefined }),
  )
  .map(([list, extra, resumeToken]) => ({ ...extra, answers: list, ...(resumeToken === undefined ? {} : { resumeToken }) }));

const body = fc.oneof(
  { weight: 5, arbitrary: batchish.map((b) => ({ json: b as unknown })) },
  { weight: 2, arbitrary: fc.jsonValue().map((b) => ({ json: b as unknown })) },
  { weight: 1, arbitrary: fc.string({ maxLength: 200 }).map((raw) => ({ raw })) },
);

describe('fuzz: the answer batch payload', () => {
  let token: string;
  let s: Started;
  beforeAll(async () => {
    const ws = await makeWorkspace();
    ({ token } = await makeLiveStudy(ws.slug));
    s = await startOk(token, { consent: true, segmentAnswers: { household: '2' } });
  });
  const trials = () => countRows('select count(*)::int as n from trial t join respondent r on r.id = t.respondent_id where r.resume_token = ?', [s.resumeToken]);
  const counter = () => countRows('select answered_count as n from respondent where resume_token = ?', [s.resumeToken]);
  const post = (rawBody: string) => callRoute(answers, { method: 'POST', params: { token }, headers: { 'x-resume-token': s.resumeToken }, rawBody });

  it('arbitrary JSON and raw text: no 5xx, clear 4xx refusals, nothing written when refused', async () => {
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const [t0, c0] = [await trials(), await counter()];
        const res = await post('raw' in b ? b.raw : JSON.stringify(b.json) ?? 'null');
        const reply = await expectCleanResponse(res);
        const [t1, c1] = [await trials(), await counter()];
        if (res.status >= 400) {
          expect(t1).toBe(t0);
          expect(c1).toBe(c0);
        } else {
          // Accepted: only answers the reply acknowledges can have been stored, and the counter follows the rows.
          expect(t1 - t0).toBeLessThanOrEqual((reply as { acknowledged: string[] }).acknowledged.length);
          expect(c1).toBe(t1);
        }
      }),
      { numRuns: fuzzRuns(200) },
    );
  });

  it('a valid batch with one answer mutated in one field: no 5xx, and a refused batch stores none of its answers', async () => {
    const fields = ['clientId', 'idx', 'answer', 'responseMs'] as const;
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: 3 }), fc.constantFrom(...fields), hostileValue, fc.boolean(), async (row, field, value, drop) => {
        // Accepted batches move the respondent on: a new one once every trial is answered.
        if ((await counter()) >= s.upcoming.length) s = await startOk(token, { consent: true, segmentAnswers: { household: '2' } });
        const from = await counter();
        const batch: Record<string, unknown>[] = s.upcoming.slice(from, from + 4).map((t) => ({ clientId: randomUUID(), idx: t.idx, answer: t.kind === 'attention' ? 2 : 1, responseMs: 700 }));
        const poisoned = batch[Math.min(row, batch.length - 1)];
        if (drop) delete poisoned[field];
        else poisoned[field] = value;
        const t0 = await trials();
        const res = await post(JSON.stringify({ answers: batch }));
        const reply = await expectCleanResponse(res);
        if (res.status >= 400) {
          expect(await trials()).toBe(t0);
          const issues = (reply as { error: { issues?: { path: string }[] } }).error.issues ?? [];
          // A refusal about one answer names its row.
          if (issues.length && issues[0].path.startsWith('answers.')) expect(issues[0].path).toMatch(/^answers\.\d+(\.|$)/);
        } else {
          expect((await trials()) - t0).toBeLessThanOrEqual(batch.length);
        }
      }),
      { numRuns: fuzzRuns(100) },
    );
  });
});
