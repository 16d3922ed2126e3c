import { FIGURES, type FigureId } from '@/lib/results-glossary';

// Technical figures never stand bare: each label carries its plain meaning as a title (hover)
// and a numbered footnote listed under its section (read on a phone and in print).

export function Term({ id, notes }: { id: FigureId; notes: FigureId[] }) {
  const n = notes.indexOf(id) + 1;
  return (
    <span title={FIGURES[id].note}>
      {FIGURES[id].label}{n > 0 ? <sup className="ml-0.5 text-muted" aria-hidden>{n}</sup> : null}
    </span>
  );
}

export function FigureNotes({ notes, testId }: { notes: FigureId[]; testId?: string }) {
  return (
    <ol className="mt-2 list-decimal space-y-0.5 pl-5 text-xs text-muted" data-testid={testId} aria-label="What the figures mean">
      {notes.map((id) => <li key={id}><span className="font-semibold">{FIGURES[id].label}</span>: {FIGURES[id].note}</li>)}
    </ol>
  );
}
