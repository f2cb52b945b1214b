import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth-options';
import { clientAddress } from '@/lib/client-key';
import { env } from '@/lib/env';
import { toResponse } from '@/lib/errors';
import { assertSignInAllowed } from '@/lib/sign-in-limits';
import { emailSchema } from '@/lib/validations/account';

const nextAuth = NextAuth(authOptions);

/**
 * A password sign-in from a client that must wait answers 429 with Retry-After before next-auth
 * sees it (RFC 6585 §4). The body also carries the `url` next-auth's client reads its error from,
 * so the sign-in form shows "Try again in N s".
 */
async function limitedSignIn(request: Request): Promise<Response | null> {
  if (!new URL(request.url).pathname.endsWith('/callback/password')) return null;
  const form = await request.clone().formData().catch(() => null);
  const email = emailSchema.safeParse(form?.get('email'));
  if (!email.success) return null;
  try {
    assertSignInAllowed(email.data, await clientAddress());
    return null;
  } catch (error) {
    const answer = toResponse(error);
    const body = (await answer.json()) as { error: string };
    const url = new URL('/sign-in', env().NEXTAUTH_URL);
    url.searchParams.set('error', body.error);
    return Response.json({ ...body, url: url.toString() }, { status: answer.status, headers: answer.headers });
  }
}

async function POST(request: Request, context: { params: Promise<{ nextauth: string[] }> }) {
  return (await limitedSignIn(request)) ?? nextAuth(request, context);
}

export { nextAuth as GET, POST };
