'use client';
import { useMemo, useState } from 'react';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import type { Messages } from '@/respondent/messages/format';
import { flowStudy } from '@/respondent/shared/screens';
import { localDriver } from './local-driver';
import { RespondentFlow } from './respondent-flow';

/**
 * The respondent's screens exactly as shown through a link, driven by a plan generated here
 * from the design, in the study's language (the page hands over its catalogue). Records nothing and makes no network calls. "Start again" draws a new seed.
 */
export function RespondentPreview({ design, messages, workspaceRetentionDays, pictureUrl = null }: { design: StudyDesign; messages: Messages; workspaceRetentionDays: number; pictureUrl?: string | null }) {
  const [run, setRun] = useState(1);
  const driver = useMemo(() => localDriver(design, run * 7919, messages), [design, run, messages]);
  return (
    <div className="flex flex-col gap-3">
      <div lang={design.language} className="mx-auto w-full max-w-[420px] rounded-md border border-rule bg-paper px-4 py-6" data-testid="respondent-preview">
        <RespondentFlow
          key={run}
          driver={driver}
          messages={messages}
          study={flowStudy(design, pictureUrl)}
          consentText={design.consentText}
          retentionDays={workspaceRetentionDays}
          questions={design.segmentQuestions}
          initial={null}
          preview
        />
      </div>
      <button type="button" className="btn self-center" onClick={() => setRun((r) => r + 1)}>Start the preview again</button>
    </div>
  );
}
