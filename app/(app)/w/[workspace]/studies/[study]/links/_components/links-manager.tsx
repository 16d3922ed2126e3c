'use client';
import { useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { linksQuery, studyApi } from '@/lib/queries/studies';
import { fetchJson } from '@/lib/fetch-json';
import type { RespondentLinkDto } from '@/lib/server/studies/respondent-links';
import { CopyButton } from './copy-button';
import { NewLinkForm } from './new-link-form';
import { linkStateLabel, type StudyStateName } from '@/lib/study-states';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { ScrollFrame } from '@/components/ui/scroll-frame';

export function LinksManager({ slug, studyId, studyState, initial, canManage }: { slug: string; studyId: string; studyState: StudyStateName; initial: RespondentLinkDto[]; canManage: boolean }) {
  const qc = useQueryClient();
  const q = linksQuery(slug, studyId);
  const { data: links = initial } = useQuery({ ...q, initialData: initial });
  const refresh = () => qc.invalidateQueries({ queryKey: q.queryKey });
  // Closing a link asks first in the app's own dialog.
  const [closing, setClosing] = useState<RespondentLinkDto | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const close = async () => {
    if (!closing) return;
    setBusy(true);
    setError(null);
    try {
      await fetchJson(`${studyApi(slug, studyId)}/links/${closing.id}`, { method: 'PATCH', body: JSON.stringify({ closed: true }) });
      await refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : 'Could not close the link.');
    } finally {
      setBusy(false);
      setClosing(null);
    }
  };
  return (
    <div className="space-y-6">
      {links.length === 0 ? (
        <p className="card p-6 text-center text-sm text-muted">No links yet. {canManage ? 'Add one below: one per source, such as a newsletter, a panel or a printed QR code.' : ''}</p>
      ) : (
        <ScrollFrame label="Respondent links" className="card">
          <table className="table" data-testid="links-table">
            <thead>
              <tr><th>Source</th><th>Link</th><th>QR code</th><th className="n">Quota</th><th className="n">Completes</th><th>Panel id</th><th>State</th>{canManage ? <th><span className="sr-only">Actions</span></th> : null}</tr>
            </thead>
            <tbody>
              {links.map((l) => {
                const qr = `${studyApi(slug, studyId)}/links/${l.id}/qr`;
                return (
                  <tr key={l.id} data-testid="link-row">
                    <td className="font-semibold">{l.source}</td>
                    <td className="max-w-[22rem]">
                      <code className="num block break-all text-xs" data-testid="link-url">{l.url}</code>
                      <CopyButton text={l.url} />
                    </td>
                    <td>
                      <a href={qr} download={`qr-${l.source.replace(/\W+/g, '-')}.png`} title="Download the QR code">
                        {/* eslint-disable-next-line @next/next/no-img-element -- a generated PNG from our own route */}
                        <img src={qr} alt={`QR code for the ${l.source} link`} width={72} height={72} className="border border-rule" />
                      </a>
                    </td>
                    <td className="n">{l.quota ?? '—'}</td>
                    <td className="n">{l.completes}{l.quota ? ` / ${l.quota}` : ''}</td>
                    <td>
                      {l.acceptsPid ? 'Passed through (?pid=)' : 'Not used'}
                      {l.pidSecret ? <span className="block text-xs">Signed by the panel (&amp;sig=), key: <code className="num break-all" data-testid="pid-secret">{l.pidSecret}</code></span> : null}
                    </td>
                    <td data-testid="link-state">{(() => { const st = linkStateLabel(Boolean(l.closedAt), studyState); return st.takesRespondents ? <span className="pill text-moss">● {st.text}</span> : <span className="pill text-muted">■ {st.text}</span>; })()}</td>
                    {canManage ? <td>{l.closedAt ? null : <button type="button" className="btn btn-danger !min-h-0 !py-1" onClick={() => setClosing(l)}>Close</button>}</td> : null}
                  </tr>
                );
              })}
            </tbody>
          </table>
        </ScrollFrame>
      )}
      {error ? <p className="field-error" role="alert">{error}</p> : null}
      <ConfirmDialog
        open={closing !== null}
        title="Close this link?"
        confirmLabel="Close link"
        danger
        busy={busy}
        onConfirm={() => void close()}
        onCancel={() => setClosing(null)}
      >
        <p>New respondents who open the link for <strong>{closing?.source}</strong> will be told it is closed, and respondents answering through it now cannot finish (their answers so far are kept). This cannot be undone.</p>
      </ConfirmDialog>
      {canManage ? <NewLinkForm slug={slug} studyId={studyId} onCreated={refresh} /> : null}
    </div>
  );
}
