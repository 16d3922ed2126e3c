'use client';
import { useState } from 'react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useQueryClient } from '@tanstack/react-query';
import { fetchJson } from '@/lib/fetch-json';
import { fieldworkQuery } from '@/lib/queries/studies';
import { allowedActions, TRANSITIONS, type StudyAction, type StudyStateName } from '@/lib/study-states';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';

// State buttons, Duplicate and Delete draft, for analysts. Each move asks first in the app's own
// dialog, with what the analyst must know at that moment, read fresh from the fieldwork figures:
// closing says how many respondents are answering now (they cannot finish afterwards);
// launching or resuming warns when the completes still to come exceed the workspace's seats.

const SAY: Record<StudyAction, { title: string; text: string; confirm: string }> = {
  launch: { title: 'Launch this study?', text: 'Its design is frozen from now on, and respondents can answer through its links.', confirm: 'Launch' },
  pause: { title: 'Pause fieldwork?', text: 'Links will say the study is paused until you resume it. Respondents answering now are stopped too; their answers so far are kept.', confirm: 'Pause' },
  resume: { title: 'Resume fieldwork?', text: 'Links accept respondents again.', confirm: 'Resume' },
  close: { title: 'Close this study for good?', text: 'No new respondents can start, and this cannot be undone.', confirm: 'Close study' },
};

type Pending = { kind: 'move'; action: StudyAction } | { kind: 'delete' };
interface Facts { inProgress: number; seatsLeft: number; toCome: number; target: number }

export function StudyActions({ slug, studyId, state }: { slug: string; studyId: string; state: StudyStateName }) {
  const router = useRouter();
  const qc = useQueryClient();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState<Pending | null>(null);
  const [facts, setFacts] = useState<Facts | null>(null);
  const api = `/api/w/${encodeURIComponent(slug)}/studies/${studyId}`;

  async function run(fn: () => Promise<void>) {
    setBusy(true);
    setError(null);
    try {
      await fn();
      setPending(null);
    } catch (err) {
      setPending(null);
      setError(err instanceof Error ? err.message : 'That did not work.');
    } finally {
      setBusy(false);
    }
  }

  const ask = async (p: Pending) => {
    setError(null);
    setFacts(null);
    setPending(p);
    if (p.kind !== 'move' || p.action === 'pause') return;
    try {
      const fw = await qc.fetchQuery({ ...fieldworkQuery(slug, studyId), staleTime: 0 });
      setFacts({ inProgress: fw.inProgress, seatsLeft: fw.seatsLeft, toCome: Math.max(0, fw.targetCompletes - fw.completes), target: fw.targetCompletes });
    } catch {
      setFacts(null); // the dialog still works; it only lacks the figures
    }
  };

  const confirm = () => {
    if (!pending) return;
    if (pending.kind === 'delete') {
      return run(async () => {
        await fetchJson(api, { method: 'DELETE' });
        router.push(`/w/${slug}`);
        router.refresh();
      });
    }
    const action = pending.action;
    return run(async () => {
      await fetchJson(`${api}/state`, { method: 'POST', body: JSON.stringify({ action }) });
      await qc.invalidateQueries({ queryKey: ['fieldwork', slug, studyId] });
      router.refresh();
    });
  };
  const duplicate = () =>
    run(async () => {
      const copy = await fetchJson<{ id: string }>(`${api}/duplicate`, { method: 'POST' });
      router.push(`/w/${slug}/studies/${copy.id}/edit`);
    });

  const move = pending?.kind === 'move' ? pending.action : null;
  const say = move ? SAY[move] : { title: 'Delete this draft?', text: 'It has never been launched, so no answers are lost.', confirm: 'Delete draft' };
  const short = facts && (move === 'launch' || move === 'resume') && facts.toCome > facts.seatsLeft;

  return (
    <>
      {allowedActions(state).map((a) => (
        <button key={a} type="button" className={a === 'close' ? 'btn btn-danger' : a === 'launch' || a === 'resume' ? 'btn btn-primary' : 'btn'} disabled={busy} onClick={() => void ask({ kind: 'move', action: a })}>
          {TRANSITIONS[a].label}
        </button>
      ))}
      <button type="button" className="btn" disabled={busy} onClick={duplicate}>Duplicate</button>
      {state === 'draft' ? <button type="button" className="btn btn-danger" disabled={busy} onClick={() => void ask({ kind: 'delete' })}>Delete draft</button> : null}
      {error ? <span className="field-error" role="alert">{error}</span> : null}
      <ConfirmDialog
        open={pending !== null}
        title={say.title}
        confirmLabel={say.confirm}
        danger={move === 'close' || pending?.kind === 'delete'}
        busy={busy}
        onConfirm={() => void confirm()}
        onCancel={() => setPending(null)}
      >
        <p>{say.text}</p>
        {move === 'close' ? (
          <p data-testid="close-in-progress" aria-live="polite">
            {facts === null ? 'Counting respondents answering now…'
              : facts.inProgress === 0 ? 'Nobody is answering right now.'
              : <><strong>{facts.inProgress} {facts.inProgress === 1 ? 'respondent is' : 'respondents are'} answering right now.</strong> Closing stops them: their answers so far are kept, but they cannot finish, and no seat is used for them.</>}
          </p>
        ) : null}
        {short ? (
          <p className="rounded-sm border border-amber bg-amber-light p-2" data-testid="seat-warning">
            <span aria-hidden>▲ </span>This study still needs {facts!.toCome.toLocaleString('en-GB')} completes, but the workspace has {facts!.seatsLeft.toLocaleString('en-GB')} {facts!.seatsLeft === 1 ? 'seat' : 'seats'} left. When seats run out, links say the study is full; answers given so far are kept.{' '}
            <Link href={`/w/${slug}/billing`}>Buy seats under Billing</Link>.
          </p>
        ) : facts && (move === 'launch' || move === 'resume') ? (
          <p className="text-muted" data-testid="seat-ok">{facts.seatsLeft.toLocaleString('en-GB')} seats left for {facts.toCome.toLocaleString('en-GB')} completes still to come.</p>
        ) : null}
      </ConfirmDialog>
    </>
  );
}
