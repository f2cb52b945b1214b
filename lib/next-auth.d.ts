import 'next-auth';
import 'next-auth/jwt';

declare module 'next-auth' {
  interface Session {
    user: { id: string; name?: string | null; email?: string | null; image?: string | null; sessionVersion?: number; sessionId?: string };
  }
  interface User {
    sessionVersion?: number;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    /** The user's session version when this session was signed in (lib/current-user.ts compares it). */
    sv?: number;
    /** This session's own id, recorded when it signs out. */
    sid?: string;
  }
}
