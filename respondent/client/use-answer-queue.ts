'use client';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { PublicTrial } from '@/respondent/shared/types';
import type { AnswerPayload, DriverResult, FlowDriver } from './driver';

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Retries with backoff (1 s, 2 s, 4 s … at most 15 s) while the failure is a retryable one. */
export async function withRetry<T>(call: () => Promise<DriverResult<T>>, onRetrying: (on: boolean) => void): Promise<DriverResult<T>> {
  for (let attempt = 0; ; attempt++) {
    const r = await call();
    if (r.ok || !r.retry) { onRetrying(false); return r; }
    onRetrying(true);
    await wait(Math.min(15_000, 1000 * 2 ** attempt));
  }
}

/**
 * Answers are sent one at a time in order, each with its own client id, so a retry after a
 * lost response stores nothing twice. The respondent moves on without waiting when the next
 * trial is already known (fixed plans); adaptive plans wait for the staircase's next trial.
 */
export function useAnswerQueue(driver: FlowDriver, handlers: {
  onNext: (next: PublicTrial | null) => void;
  onDrained: () => void;
  onStopped: (code: string, message: string) => void;
}) {
  const queue = useRef<AnswerPayload[]>([]);
  const busy = useRef(false);
  const [reconnecting, setReconnecting] = useState(false);
  const h = useRef(handlers);
  useEffect(() => { h.current = handlers; });

  const pump = useCallback(async () => {
    if (busy.current) return;
    busy.current = true;
    while (queue.current.length) {
      const a = queue.current[0];
      const r = await withRetry(() => driver.answer(a), setReconnecting);
      queue.current.shift();
      if (r.ok) {
        if (r.data.next !== undefined) h.current.onNext(r.data.next);
      } else if (r.code !== 'conflict') {
        // A refused answer (closed study, or one this respondent already gave) ends the flow calmly.
        queue.current = [];
        h.current.onStopped(r.code, r.message);
        break;
      }
    }
    busy.current = false;
    if (!queue.current.length) h.current.onDrained();
  }, [driver]);

  const push = useCallback((a: AnswerPayload) => { queue.current.push(a); void pump(); }, [pump]);
  const pending = () => queue.current.length > 0 || busy.current;
  return { push, pending, reconnecting, setReconnecting };
}
