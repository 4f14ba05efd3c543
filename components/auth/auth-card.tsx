import Link from 'next/link';
import { Wordmark } from '@/components/ui/logo';

/** The frame of the pages a person sees before signing in (sign-up, password reset, e-mail links). */
export function AuthCard({ title, intro, children, footer }: { title: string; intro?: React.ReactNode; children: React.ReactNode; footer?: React.ReactNode }) {
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <Link href="/" className="self-start"><Wordmark /></Link>
      <div className="card mt-6 p-6">
        <h1 className="text-2xl font-bold">{title}</h1>
        {intro && <div className="mt-1 text-sm text-ink-soft">{intro}</div>}
        <div className="mt-6">{children}</div>
      </div>
      {footer && <div className="mt-4 text-sm text-ink-soft">{footer}</div>}
    </main>
  );
}

export function FormAlert({ id, children, tone = 'fail' }: { id?: string; children: React.ReactNode; tone?: 'fail' | 'pass' }) {
  const colours = tone === 'fail' ? 'bg-status-fail/10 text-status-fail' : 'bg-status-pass/10 text-status-pass';
  return (
    <p id={id} role={tone === 'fail' ? 'alert' : 'status'} className={`rounded-md px-3 py-2 text-sm ${colours}`}>
      {children}
    </p>
  );
}
