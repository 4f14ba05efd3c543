import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { authOptions } from '@/lib/platform/auth/options';
import { withoutReissuedSessionCookie } from '@/lib/platform/auth/sessions';
import { refuseThrottledSignIn } from '@/lib/platform/auth/sign-in';
import { withBodyLimit } from '@/lib/platform/http';

type Ctx = { params: Promise<{ nextauth: string[] }> };

const handler = NextAuth(authOptions);

async function action(ctx: Ctx): Promise<[string | undefined, string | undefined]> {
  const [name, provider] = (await ctx.params).nextauth ?? [];
  return [name, provider];
}

/** Reading the session never stretches the cookie past the session's absolute expiry. */
async function GET(request: NextRequest, ctx: Ctx) {
  const response: Response = await handler(request, ctx);
  return (await action(ctx))[0] === 'session' ? withoutReissuedSessionCookie(response) : response;
}

/** Sign-in attempts are counted, and refused when over the limit, before next-auth checks a password. */
async function limitedPost(request: NextRequest, ctx: Ctx) {
  const [name, provider] = await action(ctx);
  if (name === 'callback' && provider === 'credentials') {
    const refused = await refuseThrottledSignIn(request, new URL(process.env.NEXTAUTH_URL ?? request.url).origin);
    if (refused) return refused;
  }
  const response: Response = await handler(request, ctx);
  return name === 'session' ? withoutReissuedSessionCookie(response) : response;
}

// A sign-in form is a few hundred bytes; next-auth would otherwise read any body whole.
const POST = withBodyLimit(limitedPost, 16 * 1024);

export { GET, POST };
