import Link from 'next/link';

export default function NotFound() {
  return (
    <main id="main" className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="kicker">404</p>
      <h1 className="mt-2 text-2xl font-bold">Nothing here</h1>
      <p className="mt-3 text-ink-soft">The page may have moved, or the project belongs to another company.</p>
      <Link href="/home" className="btn-primary mt-6">Go to your start page</Link>
    </main>
  );
}
