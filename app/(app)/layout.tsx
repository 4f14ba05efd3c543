import Link from 'next/link';
import { redirect } from 'next/navigation';
import { NavLinks } from '@/components/shell/nav-links';
import { Wordmark } from '@/components/ui/logo';
import { navigationForUser } from '@/lib/domain/roles';
import { optionalPageUser } from '@/lib/platform/auth/session';

export const dynamic = 'force-dynamic';

const roleLabel = { installer: 'Installer', inspector: 'Inspector', admin: 'Admin' } as const;

export default async function AppShell({ children }: { children: React.ReactNode }) {
  const user = await optionalPageUser();
  if (!user) redirect('/sign-in');
  return (
    <div className="min-h-screen">
      {user.isDemo && (
        <div className="no-print bg-brass px-4 py-1 text-center text-xs font-semibold text-white" role="status">
          Demo account — the companies, people, jurisdictions and projects here are invented.
        </div>
      )}
      <header className="no-print border-b border-rule bg-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link href="/home" aria-label="NookPass start page"><Wordmark /></Link>
          <nav aria-label="Main" className="flex-1">
            <NavLinks items={navigationForUser(user)} />
          </nav>
          <div className="flex items-center gap-3 text-sm">
            <span className="text-ink-soft">
              <span className="font-semibold text-ink" data-testid="shell-user">{user.name}</span>
              <span className="ml-2 rounded bg-paper-deep px-2 py-0.5 text-xs font-semibold uppercase tracking-wide" data-testid="shell-role">
                {roleLabel[user.role]}
              </span>
            </span>
            <Link href="/sign-out" className="text-ink-soft underline-offset-2 hover:underline">Sign out</Link>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-4 py-8">{children}</main>
    </div>
  );
}
