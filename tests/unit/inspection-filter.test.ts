import { describe, expect, it } from 'vitest';
import { inspectionFilterQuery, likePattern, readInspectionFilter } from '@/lib/domain/reports/inspection-filter';

describe('the inspections queue filter from the URL', () => {
  it('reads a full filter and leaves blanks out', () => {
    expect(readInspectionFilter({ q: '  48 Sample ', outcome: 'awaiting', from: '2026-12-01', to: '2026-12-04', page: '2' })).toEqual({
      filter: { q: '48 Sample', outcome: 'awaiting', from: '2026-12-01', to: '2026-12-04', page: 2 },
      errors: [],
    });
    expect(readInspectionFilter({ q: '', outcome: '', from: '', to: '' })).toEqual({ filter: { page: 1 }, errors: [] });
    expect(readInspectionFilter(new URLSearchParams('outcome=approved&other=1')).filter).toEqual({ outcome: 'approved', page: 1 });
  });

  it('names the field of a bad value and keeps the other filters', () => {
    // 2026 is not a leap year, so 29 February does not exist (Gregorian calendar).
    const r = readInspectionFilter({ q: 'permit', from: '2026-02-29', outcome: 'approved' });
    expect(r.errors).toEqual([{ path: 'from', message: 'Received from: give a date as YYYY-MM-DD.' }]);
    expect(r.filter).toEqual({ q: 'permit', outcome: 'approved', page: 1 });
    expect(readInspectionFilter({ to: '04/12/2026' }).errors[0].path).toBe('to');
    expect(readInspectionFilter({ outcome: 'pending' }).errors[0]).toMatchObject({ path: 'outcome', message: expect.stringContaining('Outcome') });
    expect(readInspectionFilter({ page: '-3' }).errors[0].path).toBe('page');
    expect(readInspectionFilter({ page: '1.5' }).errors[0].path).toBe('page');
    expect(readInspectionFilter({ q: 'x'.repeat(201) }).errors[0]).toMatchObject({ path: 'q', message: 'Search: at most 200 characters.' });
  });

  it('refuses a range that ends before it starts, on the "to" field', () => {
    const r = readInspectionFilter({ from: '2026-12-05', to: '2026-12-04' });
    expect(r.errors).toEqual([{ path: 'to', message: expect.stringContaining('before') }]);
    expect(r.filter).toEqual({ from: '2026-12-05', page: 1 });
  });

  it('takes the first of repeated query keys', () => {
    expect(readInspectionFilter({ outcome: ['approved', 'awaiting'] }).filter.outcome).toBe('approved');
  });

  it('writes the filter back as a query string for page links', () => {
    expect(inspectionFilterQuery({ q: 'a b', outcome: 'approved', page: 3 })).toBe('?q=a+b&outcome=approved&page=3');
    expect(inspectionFilterQuery({ page: 1 })).toBe('');
  });

  it('searches for % and _ literally (PostgreSQL LIKE escapes with a backslash)', () => {
    expect(likePattern('50%_a\\b')).toBe('%50\\%\\_a\\\\b%');
  });
});
