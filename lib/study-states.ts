// Study states and the moves between them: the one list of states (the Study entity's enum
// column and the screens' filters derive from it), shared by the server (which enforces the
// moves) and the screens (which only offer the moves that are allowed).

export const STUDY_STATES = ['draft', 'live', 'paused', 'closed', 'imported'] as const;
export type StudyStateName = (typeof STUDY_STATES)[number];

export const STUDY_STATE_LABELS: Record<StudyStateName, string> = {
  draft: 'Draft',
  live: 'Live',
  paused: 'Paused',
  closed: 'Closed',
  imported: 'Imported',
};

export const STUDY_ACTIONS = ['launch', 'pause', 'resume', 'close'] as const;
export type StudyAction = (typeof STUDY_ACTIONS)[number];

export const TRANSITIONS: Record<StudyAction, { from: readonly StudyStateName[]; to: StudyStateName; label: string }> = {
  launch: { from: ['draft'], to: 'live', label: 'Launch' },
  pause: { from: ['live'], to: 'paused', label: 'Pause' },
  resume: { from: ['paused'], to: 'live', label: 'Resume' },
  close: { from: ['live', 'paused'], to: 'closed', label: 'Close' },
};

export function allowedActions(state: StudyStateName): StudyAction[] {
  return STUDY_ACTIONS.filter((a) => TRANSITIONS[a].from.includes(state));
}

/** A stored design may change only while the study is a draft; afterwards it is frozen. */
export const isEditable = (state: StudyStateName) => state === 'draft';

/**
 * What a respondent link's state column says: a link takes respondents only while it is open
 * AND its study is live, so the study's state wins over the link's own (a link of a closed
 * study is never shown as open).
 */
export function linkStateLabel(linkClosed: boolean, study: StudyStateName): { text: string; takesRespondents: boolean } {
  if (linkClosed) return { text: 'Closed', takesRespondents: false };
  if (study === 'live') return { text: 'Open', takesRespondents: true };
  if (study === 'draft') return { text: 'Opens at launch', takesRespondents: false };
  if (study === 'paused') return { text: 'Study paused', takesRespondents: false };
  return { text: 'Study closed', takesRespondents: false };
}
