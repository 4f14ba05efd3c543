/** The NookPass mark: a closet outline with a check notch in its door line. */
export function Logo({ className = 'h-7 w-7' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect x="4" y="3" width="24" height="26" rx="2" fill="none" stroke="currentColor" strokeWidth="2.5" />
      <line x1="16" y1="3" x2="16" y2="29" stroke="currentColor" strokeWidth="1.5" />
      <path d="M9 17l3.5 3.5L23 10" fill="none" stroke="#a8741a" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="inline-flex items-center gap-2 text-lg font-bold tracking-tight text-ink">
      <Logo />
      NookPass
    </span>
  );
}
