/** Progress through the trials: a plain bar, never a score. */
export function Progress({ done, total }: { done: number; total: number }) {
  const pct = total > 0 ? Math.min(100, Math.round((done / total) * 100)) : 0;
  return (
    <div role="progressbar" aria-label="Progress" aria-valuemin={0} aria-valuemax={total} aria-valuenow={done} data-testid="progress" className="h-2 w-full overflow-hidden rounded-sm bg-rule">
      <div className="h-full bg-teal transition-[width]" style={{ width: `${pct}%` }} />
    </div>
  );
}

export function Reconnecting() {
  return (
    <p role="status" className="rounded-sm border border-rule bg-card px-3 py-2 text-base text-muted" data-testid="reconnecting">
      Reconnecting… your answers are kept and will be sent as soon as the connection is back.
    </p>
  );
}

export function Thanks() {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="thanks">
      <h1 className="text-3xl">Thank you</h1>
      <p className="text-lg">Your answers have been saved. You can close this page now.</p>
    </div>
  );
}

const STOPPED_TITLES: Record<string, string> = {
  study_full: 'This study is full',
  already_taken_part: 'You have already taken part',
  gone: 'This study is closed',
};

/** The flow stopped for a reason the respondent cannot change: say so plainly. */
export function Stopped({ code, message }: { code: string; message: string }) {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="stopped" data-code={code}>
      <h1 className="text-3xl">{STOPPED_TITLES[code] ?? 'We could not continue'}</h1>
      <p className="text-lg">{message}</p>
    </div>
  );
}
