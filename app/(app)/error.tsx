'use client';

export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="card border-status-fail/40 p-6">
      <h1 className="text-xl font-bold">This page could not be shown</h1>
      <p className="mt-2 text-sm text-ink-soft">
        Nothing you saved was lost. Try again; if it keeps happening, give us this reference:{' '}
        <code className="font-mono">{error.digest ?? 'none'}</code>
      </p>
      <button type="button" className="btn-primary mt-4" onClick={reset}>Try again</button>
    </div>
  );
}
