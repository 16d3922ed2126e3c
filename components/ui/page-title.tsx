export function PageTitle({ title, children }: { title: string; children?: React.ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-3 border-b border-rule pb-3">
      <h1 className="text-3xl">{title}</h1>
      {children ? <div className="flex gap-2">{children}</div> : null}
    </div>
  );
}
