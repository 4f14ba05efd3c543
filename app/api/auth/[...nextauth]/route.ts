import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth/options';
import { withBodyLimit } from '@/lib/http';

const handler = NextAuth(authOptions);
// A sign-in form is a few hundred bytes; next-auth would otherwise read any body whole.
const post = withBodyLimit(handler, 16 * 1024);
export { handler as GET, post as POST };
