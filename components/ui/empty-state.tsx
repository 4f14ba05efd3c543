export function EmptyState({ title, children, action }: { title: string; children: React.ReactNode; action?: React.ReactNode }) {
  return (
    <div className="card flex flex-col items-start gap-3 border-dashed p-8">
      <svg viewBox="0 0 48 48" className="h-10 w-10 text-rule" aria-hidden="true">
        <rect x="8" y="4" width="32" height="40" rx="3" fill="none" stroke="currentColor" strokeWidth="3" />
        <line x1="24" y1="4" x2="24" y2="44" stroke="currentColor" strokeWidth="2" />
        <circle cx="20" cy="24" r="1.8" fill="currentColor" />
        <circle cx="28" cy="24" r="1.8" fill="currentColor" />
      </svg>
      <h2 className="text-lg font-semibold">{title}</h2>
      <div className="max-w-prose text-sm text-ink-soft">{children}</div>
      {action}
    </div>
  );
}
