// Runs in the browser before the app's own modules (Next.js loads it first on every page).
// zod compiles object parsers with `new Function` when eval is allowed, and probes for that on
// first use; under the pages' script policy (no 'unsafe-eval', lib/csp.ts) the probe is refused
// and reported as a CSP violation even though zod catches it. Jitless parsing never evaluates
// code, so the pages run with no violation at all (tests/e2e/security-csp.test.ts).
import { z } from 'zod';

z.config({ jitless: true });
