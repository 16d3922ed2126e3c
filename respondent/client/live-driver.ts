import type { CompleteReply } from '@/respondent/shared/complete.schema';
import type { StartReply, StartRequest } from '@/respondent/shared/start.schema';
import { respondentUrls } from '@/respondent/shared/urls';
import type { AnswerInput } from '@/respondent/shared/answer.schema';
import type { Messages } from '@/respondent/messages/format';

/** The flow's own words for failures the server did not word (no reply, or one without a message). */
type FailureWords = Pick<Messages['stop'], 'network' | 'failed'>;
import { queueStorageKey } from './answer-queue';
import type { DriverResult, FlowDriver } from './driver';

async function post<T>(url: string, body: unknown, resume: () => string | null, words: FailureWords): Promise<DriverResult<T>> {
  try {
    const token = resume();
    const res = await fetch(url, {
      method: 'POST',
      headers: { 'content-type': 'application/json', ...(token ? { 'x-resume-token': token } : {}) },
      body: JSON.stringify(body),
      credentials: 'same-origin',
    });
    const json = await res.json().catch(() => null);
    if (res.ok) return { ok: true, data: json as T };
    const err = (json as { error?: { code?: string; message?: string } } | null)?.error;
    const retry = res.status >= 500 || res.status === 429;
    return { ok: false, retry, code: err?.code ?? String(res.status), message: err?.message ?? words.failed };
  } catch {
    return { ok: false, retry: true, code: 'network', message: words.network };
  }
}

/**
 * Talks to the link's endpoints; the resume token travels in a header, and in the body of a
 * beacon, which cannot set one (the resume cookie is scoped to /r, so /r/[token]/answers gets it too).
 */
export function liveDriver(linkToken: string, initialResume: string | null, pid: string | null, words: FailureWords): FlowDriver {
  let resume = initialResume;
  const urls = respondentUrls(linkToken);
  const answersUrl = urls.answers;
  return {
    async start(segmentAnswers) {
      const body: StartRequest = { consent: true, ...(pid ? { pid } : {}), segmentAnswers };
      const r = await post<StartReply>(urls.start, body, () => resume, words);
      if (r.ok) {
        resume = r.data.resumeToken;
        // Keep the token in the address too, so reopening this tab resumes even without cookies.
        const u = new URL(window.location.href);
        u.searchParams.set('resume', resume);
        window.history.replaceState(null, '', u.toString());
      }
      return r;
    },
    sendAnswers: (answers) => post(answersUrl, { answers }, () => resume, words),
    beaconAnswers(answers: AnswerInput[]) {
      if (typeof navigator === 'undefined' || typeof navigator.sendBeacon !== 'function') return false;
      // A plain string goes as text/plain: no preflight, and the server reads the JSON regardless.
      return navigator.sendBeacon(answersUrl, JSON.stringify({ ...(resume ? { resumeToken: resume } : {}), answers }));
    },
    storageKey: () => (resume ? queueStorageKey(resume) : null),
    complete: () => post<CompleteReply>(urls.complete, {}, () => resume, words),
  };
}
