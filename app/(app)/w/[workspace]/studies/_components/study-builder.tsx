'use client';
import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { useForm, type FieldPath } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { studyDesignSchema, type StudyDesign, type StudyDesignInput } from '@/lib/schemas/study.schema';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';
import { BuilderItem } from './builder-item';
import { BuilderTask } from './builder-task';
import { BuilderPrices } from './builder-prices';
import { BuilderTrials } from './builder-trials';
import { BuilderRespondent } from './builder-respondent';
import { BuilderFinish } from './builder-finish';
import { BuilderSummary } from './builder-summary';

const INVALID = 'Some fields need attention; they are marked in the form.';

interface Props {
  slug: string;
  /** Editing an existing draft; absent for a new study. */
  studyId?: string;
  initial: StudyDesignInput;
}

/** The study builder: the same schema validates here and in the route handler. */
export function StudyBuilder({ slug, studyId, initial }: Props) {
  const router = useRouter();
  const [status, setStatus] = useState<string | null>(null);
  const form = useForm<StudyDesignInput, unknown, StudyDesign>({ resolver: zodResolver(studyDesignSchema), defaultValues: initial, mode: 'onSubmit', reValidateMode: 'onChange' });

  const onSubmit = form.handleSubmit(
    async (design) => {
      setStatus(null);
      const url = `/api/w/${encodeURIComponent(slug)}/studies${studyId ? `/${studyId}` : ''}`;
      try {
        const saved = await fetchJson<{ id: string }>(url, { method: studyId ? 'PATCH' : 'POST', body: JSON.stringify(design) });
        setStatus('Saved.');
        router.push(`/w/${slug}/studies/${saved.id}`);
        router.refresh();
      } catch (err) {
        if (err instanceof ApiRequestError && err.issues?.length) {
          for (const i of err.issues) form.setError(i.path as FieldPath<StudyDesignInput>, { message: i.message });
        }
        setStatus(err instanceof Error ? err.message : 'Could not save the study.');
      }
    },
    () => setStatus(INVALID),
  );
  // The "fix the marked fields" note goes away once nothing is marked any more.
  const shown = status === INVALID && Object.keys(form.formState.errors).length === 0 ? null : status;

  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-6 *:min-w-0 lg:grid-cols-[1fr_17rem]" aria-label="Study builder">
      <div className="space-y-6">
        <BuilderItem form={form} slug={slug} />
        <BuilderTask form={form} />
        <BuilderPrices form={form} />
        <BuilderTrials form={form} />
        <BuilderRespondent form={form} />
        <BuilderFinish form={form} />
      </div>
      <div className="space-y-3 lg:sticky lg:top-4 lg:self-start">
        <BuilderSummary form={form} />
        <button type="submit" className="btn btn-primary w-full" disabled={form.formState.isSubmitting}>
          {studyId ? 'Save draft' : 'Save as draft'}
        </button>
        {shown ? <p role="status" className={shown === 'Saved.' ? 'text-sm text-moss' : 'field-error'}>{shown}</p> : null}
        <p className="hint">A draft can be changed freely. Once launched, its design is frozen; duplicate it to change it.</p>
      </div>
    </form>
  );
}
