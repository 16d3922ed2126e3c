// `npm run dev`: `next dev` for the app and, beside it, `vite build --watch` for the respondent
// pages' own bundle (respondent/vite.config.ts), so a change to a respondent screen or its styles
// is rebuilt without a second terminal. The respondent pages read the bundle's manifest on every
// request under `next dev`, so a reload shows the new build. Arguments go to `next dev`
// (e.g. `npm run dev -- -p 3001`). Ctrl-C (or either process ending) stops both.
import { RESPONDENT_BUILD_ARGS } from './lib/project.mjs';
import { bin, startService, stopAll } from './lib/services.mjs';

const bundle = startService('respondent', bin('vite'), [...RESPONDENT_BUILD_ARGS, '--watch']);
const app = startService('next', bin('next'), ['dev', '-H', '127.0.0.1', ...process.argv.slice(2)]);

let stopping = false;
function stop(code) {
  if (stopping) return;
  stopping = true;
  stopAll();
  setTimeout(() => process.exit(code), 300);
}
for (const child of [bundle, app]) child.on('exit', (code) => stop(code ?? 0));
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => stop(0));
