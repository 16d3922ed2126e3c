'use client';
import { useState } from 'react';
import { respondentUrls } from '@/respondent/shared/urls';
import type { FlowProps } from './respondent-flow';
import { RespondentFlow } from './respondent-flow';
import { liveDriver } from './live-driver';

/** The flow against the real link: the driver (plain fetch) is made in the browser. */
export function LiveFlow({ token, resumeToken, pid, ...rest }: Omit<FlowProps, 'driver' | 'formAction'> & { token: string; resumeToken: string | null; pid: string | null }) {
  const [driver] = useState(() => liveDriver(token, resumeToken, pid, rest.messages.stop));
  return <RespondentFlow {...rest} pid={pid} driver={driver} formAction={respondentUrls(token).start} />;
}
