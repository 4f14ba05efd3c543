import { redirect } from 'next/navigation';
import { navigationFor } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';

export default async function HomePage() {
  const user = await requirePageUser(undefined, '/home');
  redirect(navigationFor(user.role)[0].href);
}
