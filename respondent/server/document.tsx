import 'server-only';
import type { ReactElement } from 'react';
import { RESPONDENT_ASSET_BASE } from '@/respondent/bundle';
import { ConsentScreen } from '@/respondent/client/consent-screen';
import { FlowColumn, NeedsScript, Stopped, stoppedTitle, Waiting } from '@/respondent/client/status-screens';
import { BOOT_ID, ROOT_ID, bootJson, type RespondentBoot } from '@/respondent/shared/boot';
import type { Language } from '@/lib/schemas/study.schema';
import { messagesFor } from '@/respondent/messages/all';
import { languageOf } from './words';
import { bundleAssets } from './assets';

// The respondent pages as complete HTML documents, outside the App Router runtime: the first
// screen rendered on the server from the flow's own components (the consent form, the waiting
// screen or the stop screen), one stylesheet and, when the flow continues in the browser, one
// module script with its boot data in a JSON data block. No inline script, so the pages can be
// served under `script-src 'self'` (next.config.mjs). All escaping is React's. Every page is in
// its study's language (`<html lang>`, the title, the screens; unknown links: the browser's).

// Next bundles route handlers for the server-component environment, where `react-dom/server`
// resolves to a stub that throws; Node loads the real one at run time instead. The screens
// rendered here use no hooks, so they render the same under either copy of React.
const reactDomServer = () => import(/* turbopackIgnore: true */ /* webpackIgnore: true */ 'react-dom/server');

async function respondentDocument({ title, language, screen, boot = null, status = 200 }: { title: string; language: Language; screen: ReactElement; boot?: RespondentBoot | null; status?: number }): Promise<Response> {
  const [{ renderToString, renderToStaticMarkup }, a] = await Promise.all([reactDomServer(), bundleAssets()]);
  const script = boot && a.script ? a.script : null;
  // renderToString keeps the text-node boundaries hydrateRoot needs (respondent/client/main.tsx).
  const first = renderToString(screen);
  const html = renderToStaticMarkup(
    <html lang={language}>
      {/* eslint-disable-next-line @next/next/no-head-element -- a document of our own, not a Next page */}
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <meta name="theme-color" content="#FAF7F2" />
        <meta name="robots" content="noindex, nofollow" />
        <title>{`${title} · Notchwise`}</title>
        {a.styles.map((f) => <link key={f} rel="stylesheet" href={RESPONDENT_ASSET_BASE + f} />)}
        {script ? <script type="application/json" id={BOOT_ID} dangerouslySetInnerHTML={{ __html: bootJson(boot!) }} /> : null}
        {/* eslint-disable-next-line @next/next/no-sync-scripts -- a module script is deferred by nature */}
        {script ? <script type="module" src={RESPONDENT_ASSET_BASE + script} /> : null}
      </head>
      <body className="min-h-screen bg-paper text-ink antialiased">
        <main id={ROOT_ID} className="mx-auto min-h-screen w-full max-w-md px-5 pb-10 pt-6 text-lg" dangerouslySetInnerHTML={{ __html: first }} />
      </body>
    </html>,
  );
  return new Response(`<!doctype html>${html}`, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

/**
 * The consent screen as the flow renders it first, a real form posting to the start route, so
 * a respondent whose phone has not loaded the script (or has none) can still begin; the script
 * then hydrates this same markup.
 */
export function consentDocument({ action, boot }: { action: string; boot: RespondentBoot }): Promise<Response> {
  return respondentDocument({
    title: boot.messages.document.title,
    language: boot.language,
    boot,
    screen: (
      <FlowColumn>
        <ConsentScreen m={boot.messages} consentText={boot.consentText} contact={boot.study.contact} retentionDays={boot.retentionDays} action={action} pid={boot.pid} />
      </FlowColumn>
    ),
  });
}

/** A resumed visit: "One moment" until the script shows where the respondent left off. */
export function resumeDocument({ boot }: { boot: RespondentBoot }): Promise<Response> {
  const m = boot.messages;
  return respondentDocument({ title: m.document.title, language: boot.language, boot, screen: <><Waiting m={m} /><NeedsScript m={m} /></> });
}

/**
 * The stop screen (unknown, closed, paused or full; already taken part) with the status it
 * deserves, and no script. In the refusal's language (respondent/server/words.ts), else `language`.
 */
export function stoppedDocument(stop: { status: number; code: string; message: string }, language: Language = languageOf(stop)): Promise<Response> {
  const m = messagesFor(language);
  const { status, code, message } = stop;
  return respondentDocument({ title: stoppedTitle(code, m), language, status, screen: <Stopped m={m} code={code} message={message} /> });
}
