// The phone flow: everything in respondent/client is bundled by vite (respondent/vite.config.ts)
// into the respondent pages' own small script; no Next.js runtime is loaded on those pages. This
// entry takes over the server-rendered first screen (respondent/server/document.tsx): it hydrates
// the consent form, which the server rendered from the same components, or replaces the "One
// moment" shown on a resumed visit with the screen the respondent left off at. The screens are
// also rendered inside the analyst app by the study preview (respondent-preview.tsx).
import { createRoot, hydrateRoot } from 'react-dom/client';
import { BOOT_ID, ROOT_ID, type RespondentBoot } from '@/respondent/shared/boot';
import { LiveFlow } from './live-flow';
import './styles.css';

const root = document.getElementById(ROOT_ID);
const data = document.getElementById(BOOT_ID)?.textContent;
if (root && data) {
  const boot = JSON.parse(data) as RespondentBoot;
  const flow = (
    <LiveFlow token={boot.token} resumeToken={boot.resumeToken} pid={boot.pid} initial={boot.initial} study={boot.study}
      consentText={boot.consentText} retentionDays={boot.retentionDays} questions={boot.questions} messages={boot.messages} />
  );
  if (boot.initial) createRoot(root).render(flow);
  else hydrateRoot(root, flow);
}
