// The page gates answer with next/navigation's redirect() and notFound(), which throw an error whose
// `digest` tells Next.js what to render: `NEXT_REDIRECT;<type>;<url>;<status>;` (307, a temporary
// redirect, RFC 9110 15.4.8) and `NEXT_HTTP_ERROR_FALLBACK;404`. Tests read those digests.
export const NOT_FOUND = 'NEXT_HTTP_ERROR_FALLBACK;404';

/** The digest of what `run` throws; fails when it throws something else or nothing. */
export async function thrownDigest(run: () => unknown): Promise<string> {
  try {
    await run();
  } catch (error) {
    if (error && typeof error === 'object' && 'digest' in error) return String(error.digest);
    throw error;
  }
  throw new Error('expected the gate to throw');
}
