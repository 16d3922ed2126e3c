import 'server-only';
import NextAuth from 'next-auth';
import Credentials from 'next-auth/providers/credentials';
import { authConfig } from '@/lib/auth.config';
import { signInSchema } from '@/lib/schemas/auth.schema';
import { User } from '@/entities/user';
import { em } from '@/lib/server/db/orm';
import { env } from '@/lib/server/platform/env';
import { clearLimit, recordFailure } from '@/lib/server/platform/rate-limit';
import { verifyAgainstDummy, verifyPassword } from './passwords';
import { recordAudit } from './audit';

// Auth.js with the credentials provider. Lazy config: the environment is read on the first
// request, not when the build loads this file. authorize() does the same work for an unknown
// address as for a known one (a bcrypt compare against a dummy hash), and counts each wrong
// password against the account (the per-account limit in lib/server/platform/rate-limit.ts,
// keyed by the address alone and checked by the sign-in entry points before calling it); a
// right password clears that count. Tests: tests/integration/sign-in-limits.test.ts.
export const { handlers, auth, signIn, signOut } = NextAuth(() => ({
  ...authConfig,
  secret: env().AUTH_SECRET,
  useSecureCookies: env().SECURE_COOKIES ?? env().APP_URL.startsWith('https://'),
  providers: [
    Credentials({
      credentials: { email: {}, password: {} },
      async authorize(raw) {
        const parsed = signInSchema.safeParse(raw);
        if (!parsed.success) return null;
        const db = await em();
        // refresh: the request's EntityManager may hold this user from before a password change.
        const user = await db.findOne(User, { email: parsed.data.email }, { refresh: true });
        const ok = user ? await verifyPassword(parsed.data.password, user.passwordHash) : await verifyAgainstDummy(parsed.data.password);
        if (!user || !ok) {
          await recordFailure('sign-in-account', parsed.data.email);
          return null;
        }
        await clearLimit('sign-in-account', parsed.data.email);
        await recordAudit(db, { actor: user.id, action: 'auth.sign_in', target: user.email });
        return { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion };
      },
    }),
  ],
}));
