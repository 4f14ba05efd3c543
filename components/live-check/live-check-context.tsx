'use client';

import { createContext, useContext } from 'react';
import type { PlanSectionId } from '@/lib/domain/plan';

export interface SectionLiveStatus {
  fail: number;
  caution: number;
  needsInfo: number;
}

export interface LiveCheckState {
  /** 'loading' until the engine and the rule set are in; 'unavailable' without a published rule set. */
  state: 'loading' | 'ready' | 'unavailable';
  /** Live findings counted in each editor section holding a plan field they read; sections with none are absent. */
  bySection: Partial<Record<PlanSectionId, SectionLiveStatus>>;
}

export const LiveCheckContext = createContext<LiveCheckState>({ state: 'loading', bySection: {} });

/** A section's live counts for its header; null while the live check is loading or the section has no findings. */
export function useLiveSectionStatus(id: PlanSectionId): SectionLiveStatus | null {
  const { state, bySection } = useContext(LiveCheckContext);
  return state === 'ready' ? (bySection[id] ?? null) : null;
}

/**
 * Asks the editor to show a field before it is focused (a collapsed section opens): the event's detail is the
 * field's element id. Sent by the live panel when a finding is chosen.
 */
export const REVEAL_FIELD_EVENT = 'nookpass:reveal-field';
