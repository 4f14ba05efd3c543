'use client';

import { createContext, useContext } from 'react';
import type { PlanSectionId } from '@/lib/domain/plan/registry';

/**
 * How many findings fail in each editor section, and where the counts come from: the latest stored check
 * until a live check provides its own (a provider nearer the sections replaces the stored counts).
 */
export interface SectionStatus {
  source: 'stored' | 'live' | 'none';
  failBySection: Partial<Record<PlanSectionId, number>>;
  /** Said beside the counts, e.g. "from the check of revision 4". */
  caption?: string;
}

export const SectionStatusContext = createContext<SectionStatus>({ source: 'none', failBySection: {} });

export function useSectionFailCount(id: PlanSectionId): number | null {
  const status = useContext(SectionStatusContext);
  return status.source === 'none' ? null : (status.failBySection[id] ?? 0);
}

export function useSectionStatusSource(): SectionStatus {
  return useContext(SectionStatusContext);
}
