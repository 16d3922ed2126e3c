// The flow's small status screens. No hooks and no 'use client': the server document renders
// Stopped, Waiting and NeedsScript too (respondent/server/document.tsx), so both sides show one markup.
import type { ReactNode, Ref } from 'react';
import { fill, type Messages } from '@/respondent/messages/format';

/** The flow's column of screens; the server document wraps its first screen in it too, so hydration finds the same markup. */
export function FlowColumn({ children, ref }: { children: ReactNode; ref?: Ref<HTMLDivElement> }) {
  return <div ref={ref} className="flex flex-col gap-6">{children}</div>;
}

/**
 * Progress through the trials, in words ("12 of 36 answered") above a plain bar: never a score.
 * Practice rounds are counted on their own (`practice`), not in the questions' count.
 */
export function Progress({ m, done, total, practice }: { m: Messages; done: number; total: number; practice?: { n: number; of: number } }) {
  const pct = practice ? 0 : total > 0 ? Math.min(100, Math.round((done / total) * 100)) : 0;
  const words = practice ? fill(m.progress.practice, { n: practice.n, of: practice.of }) : fill(m.progress.answered, { n: done, of: total });
  return (
    <div className="flex flex-col gap-1">
      <p className="text-base tabular-nums text-muted" data-testid="progress-words">{words}</p>
      <div role="progressbar" aria-label={m.progress.label} aria-valuemin={0} aria-valuemax={total} aria-valuenow={done} aria-valuetext={words}
        data-testid="progress" className="h-2 w-full overflow-hidden rounded-sm bg-rule">
        <div className="h-full bg-teal motion-safe:transition-[width] motion-safe:duration-300" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

export function Reconnecting({ m }: { m: Messages }) {
  return (
    <p role="status" className="rounded-sm border border-rule bg-card px-3 py-2 text-base text-muted" data-testid="reconnecting">
      {m.reconnecting}
    </p>
  );
}

export function Thanks({ m, referenceCode }: { m: Messages; referenceCode?: string | null }) {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="thanks">
      <h1 className="text-3xl">{m.thanks.title}</h1>
      <p className="text-lg">{m.thanks.saved}</p>
      {referenceCode ? (
        <p className="text-base text-muted">
          {m.thanks.reference} <span className="font-mono text-ink" data-testid="reference-code">{referenceCode}</span>
          <br />{m.thanks.quote}
        </p>
      ) : null}
    </div>
  );
}

/** The heading (and the server document's title) for a stop with this error code. */
export function stoppedTitle(code: string, m: Messages): string {
  const titles = m.stop.titles;
  return code === 'not_found' || code === 'gone' || code === 'study_full' || code === 'already_taken_part' ? titles[code] : titles.other;
}

/**
 * The flow stopped for a reason the respondent cannot change: say so plainly. The one "study
 * not available" screen: the flow shows it after a refused request, and the server renders it
 * into the document for unknown, closed, paused or full links (with the status they deserve).
 */
export function Stopped({ m, code, message }: { m: Messages; code: string; message: string }) {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="stopped" data-code={code}>
      <h1 className="text-3xl">{stoppedTitle(code, m)}</h1>
      <p className="text-lg">{message}</p>
    </div>
  );
}

/** While a request is on its way (and, server-rendered, while the script loads on a resumed visit). */
export function Waiting({ m }: { m: Messages }) {
  return <p className="py-16 text-center text-lg text-muted" data-testid="waiting">{m.waiting}</p>;
}

/** Server-rendered below Waiting: what a browser without JavaScript shows instead of the flow. */
export function NeedsScript({ m }: { m: Messages }) {
  return (
    <noscript>
      <p className="text-center text-lg">{m.needsScript}</p>
    </noscript>
  );
}
