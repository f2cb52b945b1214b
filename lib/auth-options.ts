import 'server-only';
import bcrypt from 'bcryptjs';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import crypto from 'node:crypto';
import { completeSignUp, endSession, getUserByEmail, getUserById, markEmailVerified } from '@/db/queries/users';
import { clientAddress } from '@/lib/client-key';
import { assertSignInAllowed, recordSignInFailure, recordSignInSuccess } from '@/lib/sign-in-limits';
import { spendAuthToken, spendSignUpToken } from '@/lib/tokens';
import { signInSchema } from '@/lib/validations/account';

/** Session lifetime: a week, renewed while the user keeps using Fishplate. */
const SESSION_MAX_AGE_S = 7 * 24 * 60 * 60;

let dummy: string | undefined;
/** A bcrypt hash of nothing anyone can type, at the same cost as real ones (10). */
function dummyHash(): string {
  return (dummy ??= bcrypt.hashSync(`no account ${Math.random()}`, 10));
}

/** What the session keeps of a signed-in user. */
function sessionUser(user: { id: string; email: string; name: string; sessionVersion: number }) {
  return { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion };
}

/** Signs in with a one-time token from a link: `spend` uses the token up and names its user, or null. */
function oneTimeLinkProvider(id: string, name: string, spend: (token: string) => string | null) {
  return CredentialsProvider({
    id,
    name,
    credentials: { token: { type: 'text' } },
    async authorize(credentials) {
      const userId = spend(String(credentials?.token ?? ''));
      const user = userId ? getUserById(userId) : undefined;
      return user ? sessionUser(user) : null;
    },
  });
}

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
        const { email, password } = parsed.data;
        const client = await clientAddress();
        assertSignInAllowed(email, client);
        const user = getUserByEmail(email);
        // An unknown address (or one with no password) costs the same bcrypt comparison as a known
        // one, so the answer's timing does not tell which addresses have accounts.
        const ok = await bcrypt.compare(password, user?.passwordHash ?? dummyHash());
        if (!ok || !user?.passwordHash) {
          recordSignInFailure(email, client);
          return null;
        }
        recordSignInSuccess(email, client);
        return sessionUser(user);
      },
    }),
    oneTimeLinkProvider('link', 'Sign-in link', (token) => {
      const userId = spendAuthToken(token, 'sign-in');
      if (!userId) return null;
      markEmailVerified(userId);
      return userId;
    }),
    oneTimeLinkProvider('sign-up', 'Finish creating an account', (token) => {
      const pending = spendSignUpToken(token);
      if (!pending) return null;
      completeSignUp(pending.userId, pending.passwordHash, pending.name);
      return pending.userId;
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        token.sv = user.sessionVersion ?? 0;
        token.sid = crypto.randomUUID();
      }
      return token;
    },
    session({ session, token }) {
      if (session.user && token.sub) {
        session.user.id = token.sub;
        session.user.sessionVersion = token.sv;
        session.user.sessionId = token.sid;
      }
      return session;
    },
  },
  events: {
    // A signed-out cookie replayed later finds its session id among the ended ones.
    signOut({ token }) {
      if (token?.sid && token.sub) endSession(token.sid, token.sub, new Date(typeof token.exp === 'number' ? token.exp * 1000 : Date.now() + SESSION_MAX_AGE_S * 1000));
    },
  },
};
