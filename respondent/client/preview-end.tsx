import type { Messages } from '@/respondent/messages/format';

/** The preview's last screen: where a respondent is thanked, the analyst is told nothing was kept. */
export function PreviewEnd({ m }: { m: Messages }) {
  return (
    <div className="flex flex-col gap-4 py-10 text-center" data-testid="preview-end">
      <h1 className="text-3xl">{m.preview.title}</h1>
      <p className="text-lg">{m.preview.nothing}</p>
      <p className="text-base text-muted">{m.preview.here}</p>
    </div>
  );
}
