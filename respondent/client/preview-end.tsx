/** The preview's last screen: where a respondent is thanked, the analyst is told nothing was kept. */
export function PreviewEnd() {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="preview-end">
      <h1 className="text-3xl">End of the preview</h1>
      <p className="text-lg">Nothing was recorded: no answers were saved, no respondent was counted and no seat was used.</p>
      <p className="text-base text-muted">A respondent sees a thank-you screen here.</p>
    </div>
  );
}
