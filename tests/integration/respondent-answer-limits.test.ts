import { randomInt, randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it, vi } from 'vitest';

// Low answer limits for this file only (read when the env is first parsed).
vi.hoisted(() => {
  process.env.RATE_LIMIT_ANSWERS_PER_MIN = '30';
  process.env.RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN = '10';
});

import { makeWorkspace } from '../support/factories';
import { makeLiveStudy, trialRows } from '../support/respondent-fixtures';
import { answersRes, startOk, type Started } from '../support/respondent-client';
import { PEER_HEADER, peerStamp } from '@/lib/peer-stamp';

// The answer batch route's limits (respondent/server/answer-limits.ts) count answers, not
// requests, per respondent and per address; protects against one phone or one address flooding
// an instance, and that a refused batch stores nothing.

const batchOf = (s: Started, from: number, n: number) => s.upcoming.slice(from, from + n).map((t) => ({ clientId: randomUUID(), idx: t.idx, answer: t.kind === 'attention' ? 2 : 1, responseMs: 600 }));
const freshIp = () => `10.${randomInt(1, 250)}.${randomInt(1, 250)}.${randomInt(1, 250)}`;

describe('answer batch limits (answers per minute, counted by the app instance)', () => {
  let token: string;
  beforeAll(async () => {
    const ws = await makeWorkspace();
    ({ token } = await makeLiveStudy(ws.slug));
  });

  it('one respondent: 10 answers a minute pass, the 11th is a 429 with Retry-After and is not stored; another respondent is unaffected', async () => {
    const s = await startOk(token);
    const ip = { [PEER_HEADER]: peerStamp(freshIp()) };
    expect((await answersRes(token, s.resumeToken, batchOf(s, 0, 4), ip)).status).toBe(200);
    expect((await answersRes(token, s.resumeToken, batchOf(s, 4, 4), ip)).status).toBe(200);
    expect((await answersRes(token, s.resumeToken, batchOf(s, 8, 2), ip)).status).toBe(200);
    const over = await answersRes(token, s.resumeToken, batchOf(s, 10, 1), ip);
    expect(over.status).toBe(429);
    expect(over.headers.get('retry-after')).toMatch(/^\d+$/);
    expect((await over.json()).error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/Try again in \d+ seconds/) });
    expect(await trialRows(s.resumeToken)).toHaveLength(10);
    const other = await startOk(token);
    expect((await answersRes(token, other.resumeToken, batchOf(other, 0, 4), { [PEER_HEADER]: peerStamp(freshIp()) })).status).toBe(200);
  });

  it('one address: 30 answers a minute across respondents, then 429; another address still answers', async () => {
    const ip = { [PEER_HEADER]: peerStamp(freshIp()) };
    for (let i = 0; i < 3; i++) {
      const s = await startOk(token);
      expect((await answersRes(token, s.resumeToken, batchOf(s, 0, 10), ip)).status).toBe(200);
    }
    const s = await startOk(token);
    expect((await answersRes(token, s.resumeToken, batchOf(s, 0, 1), ip)).status).toBe(429);
    expect(await trialRows(s.resumeToken)).toHaveLength(0);
    expect((await answersRes(token, s.resumeToken, batchOf(s, 0, 1), { [PEER_HEADER]: peerStamp(freshIp()) })).status).toBe(200);
  });
});
