import type { NextAuthConfig } from 'next-auth';
import type {} from 'next-auth/jwt';

declare module 'next-auth' {
  interface Session {
    user: { id: string; email: string; name: string; sessionVersion: number };
  }
  interface User {
    sessionVersion?: number;
  }
}
declare module 'next-auth/jwt' {
  interface JWT {
    uid?: string;
    sv?: number;
  }
}

/** The edge-safe part of the Auth.js config (no database code). */
export const authConfig = {
  trustHost: true,
  pages: { signIn: '/sign-in' },
  session: { strategy: 'jwt', maxAge: 60 * 60 * 24 * 14 },
  providers: [],
  callbacks: {
    jwt({ token, user }) {
      if (user?.id) {
        token.uid = user.id;
        token.sv = user.sessionVersion ?? 1;
      }
      return token;
    },
    session({ session, token }) {
      if (token.uid) {
        session.user = {
          ...session.user,
          id: token.uid,
          email: token.email ?? '',
          name: token.name ?? '',
          sessionVersion: token.sv ?? 1,
        };
      }
      return session;
    },
  },
} satisfies NextAuthConfig;
