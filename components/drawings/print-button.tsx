'use client';

/** The browser's print dialog; the page's print styles lay the sheets out. */
export function PrintButton({ label = 'Print' }: { label?: string }) {
  return (
    <button type="button" className="btn-primary no-print" onClick={() => window.print()}>
      {label}
    </button>
  );
}
