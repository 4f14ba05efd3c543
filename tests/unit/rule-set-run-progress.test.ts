import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { RunProgress } from '@/components/admin/run-progress';
import { runProgressText, type RuleSetRunStatus } from '@/lib/domain/rule-sets/runs';

const status = (over: Partial<RuleSetRunStatus>): RuleSetRunStatus => ({
  id: '00000000-0000-4000-8000-000000000001',
  kind: 'impact',
  state: 'running',
  done: 120,
  total: 400,
  error: null,
  draftRevision: null,
  finishedAt: null,
  ...over,
});

describe('a run’s progress as a person reads it', () => {
  it('counts projects for an impact run and plans for a dry run', () => {
    expect(runProgressText(status({}))).toBe('120 of 400 projects');
    expect(runProgressText(status({ kind: 'dry-run', done: 3, total: 9 }))).toBe('3 of 9 plans');
    expect(runProgressText(status({ state: 'queued', done: 0, total: null }))).toBe('Waiting for a worker…');
  });

  // WAI-ARIA 1.2 "progressbar": aria-valuenow within aria-valuemin..aria-valuemax, aria-valuetext read instead of a percentage.
  it('renders a progressbar with its value for assistive technology', () => {
    const html = renderToStaticMarkup(createElement(RunProgress, { run: status({}), label: 'Impact run' }));
    expect(html).toContain('role="progressbar"');
    expect(html).toContain('aria-valuemin="0"');
    expect(html).toContain('aria-valuemax="400"');
    expect(html).toContain('aria-valuenow="120"');
    expect(html).toContain('aria-valuetext="120 of 400 projects"');
    expect(html).toContain('width:30%'); // 120 / 400
    expect(html).toMatch(/aria-labelledby="([^"]+)".*id="\1"|id="([^"]+)".*aria-labelledby="\2"/s);
  });

  it('is indeterminate (no aria-valuenow) until the worker has counted', () => {
    const html = renderToStaticMarkup(createElement(RunProgress, { run: status({ state: 'queued', done: 0, total: null }), label: 'Impact run' }));
    expect(html).toContain('role="progressbar"');
    expect(html).not.toContain('aria-valuenow');
    expect(html).toContain('Waiting for a worker…');
  });
});
