'use client';
import { useRouter } from 'next/navigation';
import { useEffect, useRef } from 'react';

/** While some studies' fits are computing, reloads the server-rendered record every few seconds (a minute at most). */
export function RefreshWhilePending({ pending }: { pending: number }) {
  const router = useRouter();
  const tries = useRef(0);
  useEffect(() => {
    if (pending === 0 || tries.current >= 15) return;
    const t = setTimeout(() => { tries.current++; router.refresh(); }, 4000);
    return () => clearTimeout(t);
  }, [pending, router]);
  if (pending === 0) return null;
  return <p role="status" className="hint mb-3">{pending} {pending === 1 ? 'study is' : 'studies are'} still being fitted; this page updates when they are ready.</p>;
}
