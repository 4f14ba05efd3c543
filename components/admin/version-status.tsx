import { ruleSetStatusLabels as labels, type RuleSetStatus } from '@/lib/domain/rule-sets/status';

const styles: Record<RuleSetStatus, string> = {
  draft: 'border-dashed border-ink/40 text-ink-soft',
  published: 'border-ink bg-ink text-paper',
  retired: 'border-rule bg-paper-deep text-ink-faint line-through decoration-1',
};


/** A rule set version's state: dashed outline = draft (editable), solid = published (unchangeable), struck = retired. */
export function VersionStatus({ status }: { status: RuleSetStatus }) {
  return (
    <span data-version-status={status} className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold uppercase tracking-wide ${styles[status]}`}>
      {labels[status]}
    </span>
  );
}
