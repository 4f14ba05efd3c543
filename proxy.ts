import { getToken } from 'next-auth/jwt';
import { NextResponse, type NextRequest } from 'next/server';
import { safeCallbackPath } from '@/lib/platform/auth/callback-url';

// Convenience only: sends anonymous visitors of app pages to sign-in early.
// Every page and route handler checks the session and role itself.
export async function proxy(request: NextRequest) {
  const token = await getToken({ req: request, secret: process.env.NEXTAUTH_SECRET });
  if (!token) {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = `?callbackUrl=${encodeURIComponent(safeCallbackPath(request.nextUrl.pathname + request.nextUrl.search))}`;
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = {
  matcher: ['/home', '/projects/:path*', '/inspections/:path*', '/rules/:path*', '/jurisdictions/:path*', '/users/:path*', '/account/:path*', '/company/:path*'],
};
