export default function Loading() {
  return (
    <div aria-busy="true" aria-label="Loading" className="space-y-3">
      <div className="h-8 w-48 animate-pulse rounded bg-rule" />
      <div className="h-40 animate-pulse rounded bg-rule/60" />
    </div>
  );
}
