'use client';
import { useEffect, useId, useRef } from 'react';

// The app's own confirmation dialog (no browser confirm box): a modal <dialog> opened with
// showModal(), so the page behind is inert and Escape cancels; Tab and Shift+Tab cycle inside it;
// focus starts on the safe choice (Cancel) for destructive moves, on the confirm button
// otherwise, and returns to the button that opened it when it closes.

interface Props {
  open: boolean;
  title: string;
  children: React.ReactNode;
  confirmLabel: string;
  /** Destructive moves get a brick confirm button and start with focus on Cancel. */
  danger?: boolean;
  busy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

const FOCUSABLE = 'a[href], button:not([disabled]), input:not([disabled]), select:not([disabled]), textarea:not([disabled]), [tabindex]:not([tabindex="-1"])';

export function ConfirmDialog({ open, title, children, confirmLabel, danger, busy, onConfirm, onCancel }: Props) {
  const ref = useRef<HTMLDialogElement>(null);
  const cancelRef = useRef<HTMLButtonElement>(null);
  const confirmRef = useRef<HTMLButtonElement>(null);
  const opener = useRef<Element | null>(null);
  const titleId = useId();
  const bodyId = useId();

  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) {
      opener.current = document.activeElement;
      d.showModal();
      (danger ? cancelRef.current : confirmRef.current)?.focus();
    } else if (!open && d.open) {
      d.close();
      if (opener.current instanceof HTMLElement) opener.current.focus();
    }
  }, [open, danger]);

  const trap = (e: React.KeyboardEvent<HTMLDialogElement>) => {
    if (e.key !== 'Tab' || !ref.current) return;
    const items = [...ref.current.querySelectorAll<HTMLElement>(FOCUSABLE)];
    if (!items.length) return;
    const first = items[0], last = items[items.length - 1];
    if (e.shiftKey && document.activeElement === first) { e.preventDefault(); last.focus(); }
    else if (!e.shiftKey && document.activeElement === last) { e.preventDefault(); first.focus(); }
  };

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={bodyId}
      className="w-[min(32rem,calc(100vw-2rem))] rounded-md border border-rule bg-card p-0 text-ink shadow-lg backdrop:bg-ink/40"
      onCancel={(e) => { e.preventDefault(); if (!busy) onCancel(); }}
      onKeyDown={trap}
      data-testid="confirm-dialog"
    >
      <div className="space-y-3 p-5">
        <h2 id={titleId} className="font-serif text-lg font-semibold">{title}</h2>
        <div id={bodyId} className="space-y-2 text-sm">{children}</div>
        <div className="flex flex-wrap justify-end gap-2 pt-2">
          <button ref={cancelRef} type="button" className="btn" onClick={onCancel} disabled={busy}>Cancel</button>
          <button ref={confirmRef} type="button" className={danger ? 'btn btn-danger' : 'btn btn-primary'} onClick={onConfirm} disabled={busy}>{busy ? 'Working…' : confirmLabel}</button>
        </div>
      </div>
    </dialog>
  );
}
