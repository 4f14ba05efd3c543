import Link from 'next/link';
import { safeCallbackPath } from '@/lib/platform/auth/callback-url';

export default async function ForbiddenPage({ searchParams }: { searchParams: Promise<{ from?: string | string[] }> }) {
  // Only a path of ours is named back to the reader; anything else is left out rather than echoed.
  const raw = (await searchParams).from;
  const from = safeCallbackPath(raw, { fallback: '' }) || null;
  return (
    <main id="main" className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="kicker">403</p>
      <h1 className="mt-2 text-2xl font-bold">Your role cannot open this page</h1>
      <p className="mt-3 text-ink-soft">
        {from ? <>The page <code className="font-mono">{from}</code> belongs to another role. </> : null}
        Ask your administrator if you need access.
      </p>
      <Link href="/home" className="btn-primary mt-6">Back to your start page</Link>
    </main>
  );
}
