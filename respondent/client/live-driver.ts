import type { CompleteReply } from '@/respondent/shared/complete.schema';
import type { StartReply, StartRequest } from '@/respondent/shared/start.schema';
import { respondentUrls } from '@/respondent/shared/urls';
import type { DriverResult, FlowDriver } from './driver';

async function post<T>(url: string, body: unknown, resume: () => string | null): Promise<DriverResult<T>> {
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
    return { ok: false, retry, code: err?.code ?? String(res.status), message: err?.message ?? 'Something went wrong.' };
  } catch {
    return { ok: false, retry: true, code: 'network', message: 'No connection.' };
  }
}

/**
 * Talks to /r/[token]/…: the resume token travels in a header, and the cookie scoped to /r comes
 * along as well (it resumes the respondent when the address lost ?resume=).
 */
export function liveDriver(linkToken: string, initialResume: string | null, pid: string | null): FlowDriver {
  let resume = initialResume;
  const urls = respondentUrls(linkToken);
  return {
    async start(segmentAnswers) {
      const body: StartRequest = { consent: true, ...(pid ? { pid } : {}), segmentAnswers };
      const r = await post<StartReply>(urls.start, body, () => resume);
      if (r.ok) {
        resume = r.data.resumeToken;
        // Keep the token in the address too, so reopening this tab resumes even without cookies.
        const u = new URL(window.location.href);
        u.searchParams.set('resume', resume);
        window.history.replaceState(null, '', u.toString());
      }
      return r;
    },
    answer: (a) => post(`/api/r/${encodeURIComponent(linkToken)}/answer`, a, () => resume),
    complete: () => post<CompleteReply>(urls.complete, {}, () => resume),
  };
}
