'use client';
import { useId } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';

interface Props {
  label: string;
  type?: string;
  registration: UseFormRegisterReturn;
  error?: string;
  hint?: string;
  autoComplete?: string;
}

/**
 * A labelled input with its field error below it. The id is unique per rendered field (useId),
 * not derived from the field name: two forms on one page may both have a `name` field, and a
 * label must point at its own input.
 */
export function TextField({ label, type = 'text', registration, error, hint, autoComplete }: Props) {
  const id = `f-${registration.name}-${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <input id={id} type={type} className="input" autoComplete={autoComplete} aria-invalid={error ? 'true' : 'false'} aria-describedby={error ? `${id}-err` : undefined} {...registration} />
      {hint && !error ? <span className="hint">{hint}</span> : null}
      {error ? <span id={`${id}-err`} className="field-error" role="alert">{error}</span> : null}
    </div>
  );
}
