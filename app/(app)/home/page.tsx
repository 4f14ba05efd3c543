import { redirect } from 'next/navigation';
import { navigationFor } from '@/lib/auth/roles';
import { requirePageUser } from '@/lib/auth/session';

export default async function HomePage() {
  const user = await requirePageUser(undefined, '/home');
  redirect(navigationFor(user.role)[0].href);
}
