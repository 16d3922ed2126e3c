import 'server-only';
import { notFound } from 'next/navigation';
import { AppError } from './errors';
import { getStudy, type StudyDetail } from '@/lib/server/studies/studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';

/** For pages: the study, or the not-found page when it is missing or another workspace's. */
export async function pageStudy(ctx: WorkspaceContext, id: string): Promise<StudyDetail> {
  try {
    return await getStudy(ctx, id);
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
}
