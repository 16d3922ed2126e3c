export function EmptyState({ title, children }: { title: string; children?: React.ReactNode }) {
  return (
    <div className="card border-dashed p-8 text-center">
      <h2 className="text-lg">{title}</h2>
      {children ? <div className="mx-auto mt-2 max-w-prose text-sm text-muted">{children}</div> : null}
    </div>
  );
}
