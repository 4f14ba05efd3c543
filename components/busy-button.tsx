'use client';

import { useEffect, useRef, useState, type ButtonHTMLAttributes, type MouseEvent, type ReactNode } from 'react';

export type BusyButtonProps = Omit<ButtonHTMLAttributes<HTMLButtonElement>, 'onClick'> & {
  /** What the button says while its work runs, e.g. "Publishing…". */
  busyText: ReactNode;
  /**
   * Work the caller tracks itself (react-hook-form's `isSubmitting`, a navigation still under way
   * after a successful save). The button is busy while this is true or while its own onClick runs.
   */
  busy?: boolean;
  /** May return a promise: the button stays busy until it settles and ignores clicks meanwhile. */
  onClick?: (event: MouseEvent<HTMLButtonElement>) => unknown;
};

/**
 * A button for slow work: while the work runs it says so (text and aria-busy), is disabled, and a
 * second press — even one that lands before React re-renders — does nothing.
 */
export function BusyButton({ busyText, busy = false, onClick, disabled, children, type = 'button', ...rest }: BusyButtonProps) {
  const [running, setRunning] = useState(false);
  // A ref, not state: two clicks in one frame both see the state from before the first one.
  const locked = useRef(false);
  const mounted = useRef(true);
  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
    };
  }, []);

  // A submit button's work belongs to the form: the lock taken on its click is released when the
  // caller's `busy` has been true and falls back to false (or at once if it never turned true).
  const submitLockSeenBusy = useRef(false);
  useEffect(() => {
    if (type !== 'submit' || !locked.current) return;
    if (busy) {
      submitLockSeenBusy.current = true;
      return;
    }
    if (submitLockSeenBusy.current) {
      submitLockSeenBusy.current = false;
      locked.current = false;
    }
  }, [busy, type]);

  const isBusy = busy || running;

  function handleClick(event: MouseEvent<HTMLButtonElement>) {
    if (locked.current || isBusy) {
      event.preventDefault();
      return;
    }
    if (type === 'submit') {
      locked.current = true;
      submitLockSeenBusy.current = false;
      // Validation that fails before the form reports busy must not leave the button locked.
      window.setTimeout(() => {
        if (!submitLockSeenBusy.current) locked.current = false;
      }, 0);
    }
    const result = onClick?.(event);
    if (result && typeof (result as Promise<unknown>).then === 'function') {
      locked.current = true;
      setRunning(true);
      void Promise.resolve(result)
        .catch(() => undefined)
        .finally(() => {
          locked.current = false;
          if (mounted.current) setRunning(false);
        });
    }
  }

  return (
    <button
      {...rest}
      type={type}
      onClick={handleClick}
      disabled={disabled || isBusy}
      aria-busy={isBusy || undefined}
      data-busy={isBusy ? 'true' : undefined}
    >
      {isBusy && (
        <span aria-hidden="true" className="inline-block h-4 w-4 rounded-full border-2 border-current border-r-transparent motion-safe:animate-spin" />
      )}
      {isBusy ? busyText : children}
    </button>
  );
}
