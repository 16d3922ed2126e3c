'use client';
// Answer keys for the phone flow's trial screens: a desktop respondent answers without a mouse
// (the keys are named on screen, KeysNote in price-tag.tsx). Buttons stay reachable with Tab.
import { useEffect, useRef } from 'react';

/**
 * Answer keys while `enabled`: key (KeyboardEvent.key) → action. Held-down repeats, keys with
 * a modifier and keys typed into a field are ignored; one key press answers at most once.
 */
export function useAnswerKeys(keys: Record<string, () => void>, enabled = true) {
  const latest = useRef(keys);
  useEffect(() => { latest.current = keys; });
  useEffect(() => {
    if (!enabled) return;
    let used = false;
    const onKey = (e: KeyboardEvent) => {
      if (used || e.repeat || e.altKey || e.ctrlKey || e.metaKey) return;
      if (e.target instanceof HTMLElement && e.target.closest('input, textarea, select')) return;
      const act = latest.current[e.key];
      if (!act) return;
      e.preventDefault();
      used = true;
      act();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [enabled]);
}
