import 'server-only';
import bcrypt from 'bcryptjs';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getUserByEmail, getUserById, markEmailVerified } from '@/db/queries/users';
import { rateLimit } from '@/lib/rate-limit';
import { spendAuthToken } from '@/lib/tokens';
import { signInSchema } from '@/lib/validations/account';

/** Session lifetime: a week, renewed while the user keeps using Fishplate. */
const SESSION_MAX_AGE_S = 7 * 24 * 60 * 60;

export const authOptions: NextAuthOptions = {
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S, updateAge: 24 * 60 * 60 },
  pages: { signIn: '/sign-in', error: '/sign-in' },
  providers: [
    CredentialsProvider({
      id: 'password',
      name: 'E-mail and password',
      credentials: { email: { type: 'email' }, password: { type: 'password' } },
      async authorize(credentials) {
        const parsed = signInSchema.safeParse(credentials);
        if (!parsed.success) return null;
        // Ten tries per address per quarter hour slows password guessing to a crawl.
        rateLimit(`sign-in:${parsed.data.email}`, 10, 15 * 60_000);
        const user = getUserByEmail(parsed.data.email);
        if (!user?.passwordHash) return null;
        const ok = await bcrypt.compare(parsed.data.password, user.passwordHash);
        return ok ? { id: user.id, email: user.email, name: user.name } : null;
      },
    }),
    CredentialsProvider({
      id: 'link',
      name: 'Sign-in link',
      credentials: { token: { type: 'text' } },
      async authorize(credentials) {
        const userId = spendAuthToken(String(credentials?.token ?? ''), 'sign-in');
        if (!userId) return null;
        const user = getUserById(userId);
        if (!user) return null;
        markEmailVerified(user.id);
        return { id: user.id, email: user.email, name: user.name };
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    session({ session, token }) {
      if (session.user && token.sub) session.user.id = token.sub;
      return session;
    },
  },
};
