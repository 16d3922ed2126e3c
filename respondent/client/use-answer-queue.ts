'use client';
import { useEffect, useState } from 'react';
import { AnswerQueue, type QueueStorage } from './answer-queue';
import type { DriverResult, FlowDriver } from './driver';

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Retries with backoff (1 s, 2 s, 4 s … at most 15 s) while the failure is a retryable one (start, complete). */
export async function withRetry<T>(call: () => Promise<DriverResult<T>>, onRetrying: (on: boolean) => void): Promise<DriverResult<T>> {
  for (let attempt = 0; ; attempt++) {
    const r = await call();
    if (r.ok || !r.retry) { onRetrying(false); return r; }
    onRetrying(true);
    await wait(Math.min(15_000, 1000 * 2 ** attempt));
  }
}

/** localStorage when the browser lets the page use it (not on the server, not when blocked). */
export function browserStorage(): QueueStorage | null {
  try {
    return typeof window === 'undefined' ? null : window.localStorage;
  } catch {
    return null;
  }
}

/**
 * The answer queue (./answer-queue.ts) bound to the page: the driver sends, localStorage keeps,
 * and the page's lifecycle events hand what waits to a beacon (hidden, closed) or retry at once
 * (back online). `reconnecting` is true while a send is failing and being retried. The page
 * gives its callbacks with `queue.listen` after each render.
 */
export function useAnswerQueue(driver: FlowDriver) {
  const [reconnecting, setReconnecting] = useState(false);
  const [queue] = useState(() => new AnswerQueue({
    send: (batch) => driver.sendAnswers(batch),
    beacon: driver.beaconAnswers ? (batch) => driver.beaconAnswers!(batch) : undefined,
    storage: browserStorage(),
    storageKey: () => driver.storageKey(),
    isOnline: () => typeof navigator === 'undefined' || navigator.onLine !== false,
    onRetrying: setReconnecting,
  }));

  useEffect(() => {
    const hidden = () => queue.pageHidden();
    const visibility = () => { if (document.visibilityState === 'hidden') queue.pageHidden(); };
    const online = () => queue.online();
    window.addEventListener('pagehide', hidden);
    document.addEventListener('visibilitychange', visibility);
    window.addEventListener('online', online);
    return () => {
      window.removeEventListener('pagehide', hidden);
      document.removeEventListener('visibilitychange', visibility);
      window.removeEventListener('online', online);
    };
  }, [queue]);

  return { queue, reconnecting, setReconnecting };
}
