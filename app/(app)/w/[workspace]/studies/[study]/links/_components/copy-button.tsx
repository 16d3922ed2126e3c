'use client';
import { useState } from 'react';

/** Copies to the clipboard and says so in words for a moment. */
export function CopyButton({ text }: { text: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(text);
      setState('copied');
    } catch {
      setState('failed');
    }
    setTimeout(() => setState('idle'), 2500);
  };
  return (
    <span className="mt-1 inline-flex items-center gap-2">
      <button type="button" className="btn !min-h-0 !py-0.5 text-xs" onClick={copy}>Copy link</button>
      <span role="status" className={state === 'failed' ? 'field-error' : 'text-xs text-moss'}>
        {state === 'copied' ? '✓ Copied' : state === 'failed' ? 'Copy failed: select the link and copy it by hand.' : ''}
      </span>
    </span>
  );
}
