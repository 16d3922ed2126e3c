export function FitProgress({ message, stale = false }: { message: string; stale?: boolean }) {
  return (
    <div role="status" aria-live="polite" data-testid="fit-progress" className="card flex items-center gap-3 p-4 text-sm">
      <span className="inline-block h-3 w-3 animate-pulse rounded-full bg-teal" aria-hidden />
      <span>{message}{stale ? ' The figures below are from the previous fit until the new one is ready.' : ''}</span>
    </div>
  );
}
