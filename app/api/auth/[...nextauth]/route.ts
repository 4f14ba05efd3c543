import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { authOptions } from '@/lib/auth/options';
import { refuseThrottledSignIn } from '@/lib/auth/sign-in';

type Ctx = { params: Promise<{ nextauth: string[] }> };

const handler = NextAuth(authOptions);

/** Sign-in attempts are counted, and refused when over the limit, before next-auth checks a password. */
async function POST(request: NextRequest, ctx: Ctx) {
  const [action, provider] = (await ctx.params).nextauth ?? [];
  if (action === 'callback' && provider === 'credentials') {
    const refused = await refuseThrottledSignIn(request, new URL(process.env.NEXTAUTH_URL ?? request.url).origin);
    if (refused) return refused;
  }
  return handler(request, ctx);
}

export { handler as GET, POST };
