export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="animate-pulse space-y-6">
      <div className="h-8 w-72 rounded bg-paper-deep" />
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="h-96 rounded-lg bg-paper-deep" />
        <div className="h-96 rounded-lg bg-paper-deep" />
      </div>
      <div className="h-48 rounded-lg bg-paper-deep" />
      <span className="sr-only">Drawing the plan…</span>
    </div>
  );
}
