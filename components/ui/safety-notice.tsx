/** The caution that goes wherever findings or plans are shown. */
export function SafetyNotice({ compact = false }: { compact?: boolean }) {
  return (
    <aside
      role="note"
      aria-label="Safety and authority notice"
      className="rounded-md border-l-4 border-brass bg-brass-soft/60 px-4 py-3 text-sm text-ink"
    >
      <p className="font-semibold">The locally adopted code, the AHJ and licensed trades govern.</p>
      {!compact && (
        <p className="mt-1 text-ink-soft">
          NookPass checks a plan against the rules its jurisdiction&apos;s administrator recorded; it does not replace the
          inspection. Lint in a dryer duct can catch fire, a gas dryer can make carbon monoxide, and a leaking washer
          can damage the structure: gas and electrical work belong to licensed trades, and the appliance maker&apos;s
          installation instructions apply alongside the code.
        </p>
      )}
    </aside>
  );
}
