// Entry of the respondent pages' own bundle (scripts/build-respondent.mjs): mounts the live flow
// over the server-rendered first screen. No Next.js runtime is loaded on these pages.
import { createRoot } from 'react-dom/client';
import { BOOT_ID, ROOT_ID, type RespondentBoot } from '@/respondent/shared/boot';
import { LiveFlow } from './live-flow';
import './styles.css';

const root = document.getElementById(ROOT_ID);
const data = document.getElementById(BOOT_ID)?.textContent;
if (root && data) {
  const boot = JSON.parse(data) as RespondentBoot;
  // createRoot (not hydrate): the server's consent form is plain HTML of the same markup, replaced on the first render.
  createRoot(root).render(
    <LiveFlow token={boot.token} resumeToken={boot.resumeToken} pid={boot.pid} initial={boot.initial} study={boot.study}
      consentText={boot.consentText} retentionDays={boot.retentionDays} questions={boot.questions} />,
  );
}
