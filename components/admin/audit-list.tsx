import type { AuditItem } from '@/db/audit';
import { formatDateTime } from '@/lib/domain/dates/format';

const actionLabels: Record<string, string> = {
  'jurisdiction.create': 'created the jurisdiction',
  'jurisdiction.update': 'edited the jurisdiction',
  'rule-set.draft.create': 'started a draft',
  'rule-set.draft.save': 'saved the draft',
  'rule-set.draft.discard': 'discarded a draft',
  'rule-set.rule.add': 'added a rule',
  'rule-set.rule.update': 'edited a rule',
  'rule-set.rule.disable': 'disabled a rule',
  'rule-set.rule.enable': 're-enabled a rule',
  'rule-set.rule.delete': 'removed a rule',
  'rule-set.dry-run': 'ran a dry run',
  'rule-set.publish': 'published',
  'rule-set.retire': 'retired',
};

function detailText(item: AuditItem): string {
  const d = item.details as Record<string, unknown>;
  const parts: string[] = [];
  if (typeof d.version === 'number') parts.push(`version ${d.version}`);
  if (typeof d.ruleKey === 'string') parts.push(d.ruleKey);
  if (typeof d.revision === 'number') parts.push(`revision ${d.revision}`);
  if (typeof d.successorVersion === 'number') parts.push(`replaced by version ${d.successorVersion}`);
  if (typeof d.source === 'string') parts.push(d.source);
  if (typeof d.changelog === 'string') parts.push(`“${d.changelog}”`);
  if (d.changed && typeof d.changed === 'object') parts.push(Object.keys(d.changed).join(', ').replace(/_/g, ' ') || 'no change');
  return parts.join(' · ');
}

export function AuditList({ items, timeZone }: { items: AuditItem[]; timeZone: string }) {
  if (items.length === 0) return <p className="text-sm text-ink-soft">Nothing recorded yet.</p>;
  return (
    <ol className="divide-y divide-rule text-sm" data-testid="audit-trail">
      {items.map((item) => (
        <li key={item.id} className="py-2" data-action={item.action}>
          <span className="font-semibold">{item.actorEmail ?? 'former user'}</span> {actionLabels[item.action] ?? item.action}
          <span className="text-ink-faint"> · {formatDateTime(item.at, timeZone)}</span>
          <div className="text-ink-soft">{detailText(item)}</div>
        </li>
      ))}
    </ol>
  );
}
