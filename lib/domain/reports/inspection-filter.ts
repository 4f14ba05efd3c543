import { z } from 'zod';

// The inspector's queue filters, read from the URL query (the page's GET form and the list API share them).
// Pure: the repository turns the parsed filter into SQL.

export const INSPECTIONS_PAGE_SIZE = 25;
export const MAX_INSPECTION_SEARCH_LENGTH = 200;

/** What the queue can be narrowed to; `awaiting` is a report with no outcome recorded yet. */
export const inspectionOutcomeFilters = ['awaiting', 'approved', 'corrections-needed'] as const;
export type InspectionOutcomeFilter = (typeof inspectionOutcomeFilters)[number];
export const inspectionOutcomeFilterLabels: Record<InspectionOutcomeFilter, string> = {
  awaiting: 'Awaiting your outcome',
  approved: 'Approved',
  'corrections-needed': 'Corrections needed',
};

// A field left blank in the GET form arrives as '' and means "no filter".
const optional = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (v === '' ? undefined : v), schema.optional());
const day = (label: string) => optional(z.iso.date(`${label}: give a date as YYYY-MM-DD.`));
const pageMessage = 'Page: give a whole number from 1.';

export const inspectionFilterSchema = z
  .strictObject({
    q: z
      .string()
      .trim()
      .max(MAX_INSPECTION_SEARCH_LENGTH, `Search: at most ${MAX_INSPECTION_SEARCH_LENGTH} characters.`)
      .optional()
      .transform((v) => (v ? v : undefined)),
    outcome: optional(z.enum(inspectionOutcomeFilters, 'Outcome: choose awaiting your outcome, approved or corrections needed.')),
    from: day('Received from'),
    to: day('Received to'),
    page: optional(z.coerce.number(pageMessage).int(pageMessage).min(1, pageMessage).max(100_000, 'Page: at most 100000.')).transform((v) => v ?? 1),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, { path: ['to'], message: 'Received to: the date is before "received from".' });

export type InspectionFilter = z.output<typeof inspectionFilterSchema>;

export type InspectionFilterProblem = { path: string; message: string };

type RawQuery = Record<string, string | string[] | undefined> | URLSearchParams;

const filterKeys = ['q', 'outcome', 'from', 'to', 'page'] as const;

/**
 * Reads the filter from a query string. Unknown query keys are ignored (links and bookmarks may carry others);
 * a bad value gives its problem, naming the field, and the filter without that value so the page still lists.
 */
export function readInspectionFilter(raw: RawQuery): { filter: InspectionFilter; errors: InspectionFilterProblem[] } {
  const get = (k: string) => {
    const v = raw instanceof URLSearchParams ? raw.get(k) ?? undefined : raw[k];
    return Array.isArray(v) ? v[0] : v;
  };
  const input: Record<string, string | undefined> = Object.fromEntries(filterKeys.map((k) => [k, get(k)]));
  const parsed = inspectionFilterSchema.safeParse(input);
  if (parsed.success) return { filter: parsed.data, errors: [] };
  const errors = parsed.error.issues.map((i) => ({ path: i.path.join('.') || 'query', message: i.message }));
  const bad = new Set(errors.map((e) => e.path));
  const rest = Object.fromEntries(Object.entries(input).filter(([k]) => !bad.has(k)));
  const fallback = inspectionFilterSchema.safeParse(rest);
  return { filter: fallback.success ? fallback.data : inspectionFilterSchema.parse({}), errors };
}

/** The query string of a filter (for pagination links), leaving out what is unset. */
export function inspectionFilterQuery(f: Partial<InspectionFilter>): string {
  const params = new URLSearchParams();
  if (f.q) params.set('q', f.q);
  if (f.outcome) params.set('outcome', f.outcome);
  if (f.from) params.set('from', f.from);
  if (f.to) params.set('to', f.to);
  if (f.page && f.page > 1) params.set('page', String(f.page));
  const s = params.toString();
  return s ? `?${s}` : '';
}

/** `%` and `_` typed into the search are looked for literally, not as wildcards. */
export function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
