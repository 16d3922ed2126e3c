'use client';
import type { FieldErrors, UseFormReturn } from 'react-hook-form';
import type { StudyDesign, StudyDesignInput } from '@/lib/schemas/study.schema';

export type BuilderForm = UseFormReturn<StudyDesignInput, unknown, StudyDesign>;

/** The message at a dotted path; array-level errors may sit on the array itself or on its `root`. */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  let cur: unknown = errors;
  for (const k of path.split('.')) {
    if (cur == null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[k];
  }
  const e = cur as { message?: unknown; root?: { message?: string } } | undefined;
  return (typeof e?.message === 'string' ? e.message : undefined) ?? e?.root?.message;
}

export const fieldId = (name: string) => `f-${name.replace(/\./g, '-')}`;

/** Label, control, then either the hint or the error (announced). */
export function Field({ label, name, error, hint, children, className }: { label: string; name: string; error?: string; hint?: React.ReactNode; children: React.ReactNode; className?: string }) {
  const id = fieldId(name);
  return (
    <div className={`field ${className ?? ''}`}>
      <label htmlFor={id}>{label}</label>
      {children}
      {hint && !error ? <span className="hint">{hint}</span> : null}
      {error ? <span id={`${id}-err`} className="field-error" role="alert">{error}</span> : null}
    </div>
  );
}

export function Section({ title, children, intro }: { title: string; intro?: React.ReactNode; children: React.ReactNode }) {
  return (
    <fieldset className="card space-y-4 p-5">
      <legend className="px-1 font-serif text-lg font-semibold">{title}</legend>
      {intro ? <p className="text-sm text-muted">{intro}</p> : null}
      {children}
    </fieldset>
  );
}

/** Fractions shown as percentages, without float noise (0.07 → "7"). */
export const pct = (f: number) => String(Math.round(f * 100_000) / 1000);
