import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as createStudy } from '@/app/api/w/[workspace]/studies/route';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';
import { countRows, expectCleanResponse, fuzzRuns, hostileValue } from '../support/fuzz';

// POST /api/w/[ws]/studies: arbitrary objects and one-field mutations of a valid design. Never a
// 500; a refusal is a 4xx with the error shape and stores no study; an accepted one stores one.

describe('fuzz: the study design schema', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
  });
  const studies = () => countRows('select count(*)::int as n from study s join workspace w on w.id = s.workspace_id where w.slug = ?', [ws.slug]);

  async function post(body: unknown) {
    signInAs(ws.owner);
    const before = await studies();
    const res = await callRoute(createStudy, { method: 'POST', params: { workspace: ws.slug }, rawBody: JSON.stringify(body) ?? 'null' });
    await expectCleanResponse(res);
    expect(await studies()).toBe(before + (res.status === 201 ? 1 : 0));
    return res;
  }

  it('the valid design itself is stored (the properties below start from it)', async () => {
    expect((await post(validDesign())).status).toBe(201);
  });

  it('arbitrary JSON values and objects', async () => {
    await fc.assert(fc.asyncProperty(fc.oneof(fc.jsonValue(), fc.object({ maxDepth: 3 })), async (b) => void (await post(b))), { numRuns: fuzzRuns(100) });
  });

  const keys = Object.keys(validDesign());
  const mutation = fc.oneof(
    fc.record({ op: fc.constant('set' as const), key: fc.constantFrom(...keys), value: hostileValue }),
    fc.record({ op: fc.constant('drop' as const), key: fc.constantFrom(...keys) }),
    fc.record({ op: fc.constant('extra' as const), key: fc.string({ minLength: 1, maxLength: 12 }), value: hostileValue }),
    fc.record({ op: fc.constant('nested' as const), key: fc.constantFrom('basePrices', 'ladder', 'segmentQuestions', 'attentionCheck', 'adaptive'), value: hostileValue }),
  );

  it('a valid design with one to three fields replaced, dropped, added or poisoned inside', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(mutation, { minLength: 1, maxLength: 3 }), async (muts) => {
        const d = structuredClone(validDesign()) as Record<string, unknown>;
        for (const m of muts) {
          if (m.op === 'drop') delete d[m.key];
          else if (m.op === 'nested') {
            const inner = d[m.key];
            if (Array.isArray(inner)) inner.push(m.value);
            else if (inner && typeof inner === 'object') (inner as Record<string, unknown>).enabled = m.value;
          } else d[m.key] = m.value;
        }
        await post(d);
      }),
      { numRuns: fuzzRuns(150) },
    );
  });
});
