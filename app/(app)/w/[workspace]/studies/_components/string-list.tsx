'use client';

interface Props {
  name: string;
  label: string;
  values: string[];
  onChange: (v: string[]) => void;
  errorFor: (i: number) => string | undefined;
  listError?: string;
  addLabel: string;
  max: number;
  inputMode?: 'decimal' | 'text';
  hint?: string;
}

/** An editable list of short values, one input per row, with add and remove. */
export function StringList({ name, label, values, onChange, errorFor, listError, addLabel, max, inputMode = 'text', hint }: Props) {
  const set = (i: number, v: string) => onChange(values.map((x, k) => (k === i ? v : x)));
  return (
    <div className="field" role="group" aria-labelledby={`${name}-label`}>
      <span id={`${name}-label`} className="label">{label}</span>
      <ol className="space-y-2">
        {values.map((v, i) => {
          const err = errorFor(i);
          return (
            <li key={i} className="flex flex-wrap items-center gap-2">
              <input
                className="input !w-48"
                aria-label={`${label} ${i + 1}`}
                inputMode={inputMode}
                value={v}
                aria-invalid={err ? 'true' : 'false'}
                onChange={(e) => set(i, e.target.value)}
              />
              <button type="button" className="btn !min-h-0 !py-1" onClick={() => onChange(values.filter((_, k) => k !== i))} aria-label={`Remove ${label.toLowerCase()} ${i + 1}`}>
                Remove
              </button>
              {err ? <span className="field-error" role="alert">{err}</span> : null}
            </li>
          );
        })}
      </ol>
      <div>
        <button type="button" className="btn !min-h-0 !py-1" disabled={values.length >= max} onClick={() => onChange([...values, ''])}>{addLabel}</button>
      </div>
      {hint && !listError ? <span className="hint">{hint}</span> : null}
      {listError ? <span className="field-error" role="alert">{listError}</span> : null}
    </div>
  );
}
