'use client';

import { createContext, lazy, Suspense, useContext, useEffect, useState, type ReactNode } from 'react';
import { LiveCheckContext, type LiveCheckState } from '@/components/live-check/live-check-context';

// The engine, the rules and the drawings come in their own chunk, after the form is usable.
const LiveCheckBody = lazy(() => import('@/components/live-check/live-check-body'));

export interface LiveSource {
  /** The project's jurisdiction and its published rule set version; null before a first publication. */
  jurisdiction: string;
  version: number | null;
}

const SetterContext = createContext<(s: LiveCheckState) => void>(() => {});

/** Holds the live findings' counts per section for the editor's section headers. */
export function LiveCheckProvider({ source, children }: { source: LiveSource; children: ReactNode }) {
  const [state, setState] = useState<LiveCheckState>(() => ({ state: source.version === null ? 'unavailable' : 'loading', bySection: {} }));
  return (
    <LiveCheckContext.Provider value={state}>
      <SetterContext.Provider value={setState}>{children}</SetterContext.Provider>
    </LiveCheckContext.Provider>
  );
}

/** Waits for the browser to be idle after the first render, so the form is usable before the engine loads. */
function useAfterFirstIdle(): boolean {
  const [ready, setReady] = useState(false);
  useEffect(() => {
    const idle = (window as Window & { requestIdleCallback?: (cb: () => void, o?: { timeout: number }) => number }).requestIdleCallback;
    if (idle) {
      const handle = idle(() => setReady(true), { timeout: 1500 });
      return () => (window as Window & { cancelIdleCallback?: (h: number) => void }).cancelIdleCallback?.(handle);
    }
    const timer = setTimeout(() => setReady(true), 200);
    return () => clearTimeout(timer);
  }, []);
  return ready;
}

/** The "Live check" region: the findings for the plan as it is typed, computed in the browser. */
export function LiveCheckPanel({ source }: { source: LiveSource }) {
  const setState = useContext(SetterContext);
  const started = useAfterFirstIdle();
  const { state } = useContext(LiveCheckContext);
  return (
    <section
      aria-labelledby="live-check-title"
      className="card p-4 lg:sticky lg:top-20 lg:max-h-[calc(100vh-6rem)] lg:overflow-y-auto"
      data-testid="live-check"
      data-live-state={state}
    >
      <h2 id="live-check-title" className="text-lg font-bold">Live check</h2>
      {source.version === null ? (
        <p className="mt-2 text-sm text-ink-soft">This jurisdiction has no published rule set yet, so nothing can be checked while you type.</p>
      ) : started ? (
        <div className="mt-2">
          <Suspense fallback={<p className="text-sm text-ink-soft" data-testid="live-loading">Loading the live check…</p>}>
            <LiveCheckBody slug={source.jurisdiction} version={source.version} onState={setState} />
          </Suspense>
        </div>
      ) : (
        <p className="mt-2 text-sm text-ink-soft" data-testid="live-loading">The live check starts once the form is ready.</p>
      )}
    </section>
  );
}
