'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/lib/fetch-json';
import { allowedActions, TRANSITIONS, type StudyAction, type StudyStateName } from '@/lib/study-states';

const CONFIRM: Record<StudyAction, string> = {
  launch: 'Launch this study? Its design is frozen from now on, and respondents can answer through its links.',
  pause: 'Pause fieldwork? Links will say the study is paused until you resume it.',
  resume: 'Resume fieldwork? Links accept respondents again.',
  close: 'Close this study for good? No new respondents can start; this cannot be undone.',
};

/** State buttons and Duplicate, for analysts; each state move asks first. */
export function StudyActions({ slug, studyId, state }: { slug: string; studyId: string; state: StudyStateName }) {
  const router = useRouter();
  const qc = useQueryClient();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const api = `/api/w/${encodeURIComponent(slug)}/studies/${studyId}`;

  async function run(fn: () => Promise<void>) {
    setBusy(true);
    setError(null);
    try {
      await fn();
    } catch (err) {
      setError(err instanceof Error ? err.message : 'That did not work.');
    } finally {
      setBusy(false);
    }
  }
  const move = (action: StudyAction) =>
    run(async () => {
      if (!window.confirm(CONFIRM[action])) return;
      await fetchJson(`${api}/state`, { method: 'POST', body: JSON.stringify({ action }) });
      await qc.invalidateQueries({ queryKey: ['fieldwork', slug, studyId] });
      router.refresh();
    });
  const duplicate = () =>
    run(async () => {
      const copy = await fetchJson<{ id: string }>(`${api}/duplicate`, { method: 'POST' });
      router.push(`/w/${slug}/studies/${copy.id}/edit`);
    });

  const remove = () =>
    run(async () => {
      if (!window.confirm('Delete this draft? It has never been launched, so no answers are lost.')) return;
      await fetchJson(api, { method: 'DELETE' });
      router.push(`/w/${slug}`);
      router.refresh();
    });

  return (
    <>
      {allowedActions(state).map((a) => (
        <button key={a} type="button" className={a === 'close' ? 'btn btn-danger' : a === 'launch' || a === 'resume' ? 'btn btn-primary' : 'btn'} disabled={busy} onClick={() => move(a)}>
          {TRANSITIONS[a].label}
        </button>
      ))}
      <button type="button" className="btn" disabled={busy} onClick={duplicate}>Duplicate</button>
      {state === 'draft' ? <button type="button" className="btn btn-danger" disabled={busy} onClick={remove}>Delete draft</button> : null}
      {error ? <span className="field-error" role="alert">{error}</span> : null}
    </>
  );
}
