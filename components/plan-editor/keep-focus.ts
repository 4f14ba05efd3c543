'use client';

import { useEffect, useRef } from 'react';

/**
 * Moves the keyboard focus to an element of a list once the list has re-rendered after an add or a
 * remove, so a keyboard or screen-reader user is not dropped back to the top of the page.
 */
export function useKeepFocus(): (id: string) => void {
  const pending = useRef<{ id: string; renders: number } | null>(null);
  // Runs after every render: a new piece may show its own fields only once the watched values catch up;
  // a target that never appears is dropped after a few renders so it cannot pull the focus later.
  useEffect(() => {
    if (!pending.current) return;
    const el = document.getElementById(pending.current.id);
    if (el) el.focus();
    if (el || ++pending.current.renders > 3) pending.current = null;
  });
  return (id: string) => {
    pending.current = { id, renders: 0 };
  };
}
