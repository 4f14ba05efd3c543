export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="animate-pulse space-y-4">
      <div className="h-8 w-64 rounded bg-paper-deep" />
      <div className="h-40 rounded-lg bg-paper-deep" />
      <span className="sr-only">Loading…</span>
    </div>
  );
}
