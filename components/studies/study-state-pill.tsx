import clsx from 'clsx';
import { STUDY_STATE_LABELS, type StudyStateName } from '@/lib/study-states';

// A shape beside each label, so the state never rests on colour alone.
const LOOK: Record<StudyStateName, { mark: string; cls: string }> = {
  draft: { mark: '○', cls: 'text-muted' },
  live: { mark: '●', cls: 'text-moss' },
  paused: { mark: '‖', cls: 'text-amber' },
  closed: { mark: '■', cls: 'text-ink' },
  imported: { mark: '◆', cls: 'text-teal' },
};

export function StudyStatePill({ state }: { state: StudyStateName }) {
  const look = LOOK[state];
  return (
    <span className={clsx('pill', look.cls)} data-state={state}>
      <span aria-hidden="true">{look.mark}</span>
      {STUDY_STATE_LABELS[state]}
    </span>
  );
}
