import type { Drawing, MarkStatus, ShapeRole } from '@/lib/domain/drawing';
import { StatusMark } from '@/components/ui/status-badge';
import { hatchStroke, roleLegend, roleStyle, statusStroke } from '@/components/drawings/drawing-style';

function Swatch({ role, status }: { role: ShapeRole; status?: MarkStatus }) {
  const style = roleStyle[role];
  const hatch = status && role === 'clearance-fail' ? status : style.hatch;
  const line = role === 'dimension' || role === 'limit' || role === 'door-swing' || role === 'centre-line' || role === 'floor' || role === 'hinge';
  const stroke = status ? statusStroke[status] : style.stroke;
  const dash = style.dash?.map((d) => d * 1.2).join(' ');
  return (
    <svg viewBox="0 0 28 16" className="h-4 w-7 shrink-0" aria-hidden="true">
      {line ? (
        <line x1="2" y1="8" x2="26" y2="8" className={stroke} strokeWidth={Math.max(1, style.weight)} strokeDasharray={dash} />
      ) : role === 'cup' || role === 'hole' ? (
        <circle cx="14" cy="8" r="6" className={`${style.fill} ${stroke}`} strokeWidth="1.2" />
      ) : (
        <>
          <rect x="2" y="2" width="24" height="12" className={style.fill} fillOpacity={style.fillOpacity} />
          {hatch && [6, 12, 18, 24].map((x) => <line key={x} x1={x - 6} y1="14" x2={x + 2} y2="2" className={hatchStroke[hatch]} strokeWidth="1" />)}
          <rect x="2" y="2" width="24" height="12" fill="none" className={stroke} strokeWidth={Math.max(1, style.weight)} strokeDasharray={dash} />
        </>
      )}
    </svg>
  );
}

/** The roles a drawing actually uses, with our symbols, plus the status marks it shows. */
export function DrawingLegend({ drawing }: { drawing: Drawing }) {
  const seen = new Map<ShapeRole, MarkStatus | undefined>();
  const statuses = new Set<MarkStatus>();
  for (const shape of drawing.shapes) {
    if (shape.kind === 'mark') statuses.add(shape.status);
    // Only the failing-clearance swatch takes a status colour; other roles show their plain look.
    if (roleLegend[shape.role] && !seen.has(shape.role)) seen.set(shape.role, shape.role === 'clearance-fail' ? shape.status : undefined);
  }
  if (seen.size === 0 && statuses.size === 0) return null;
  return (
    <ul className="mt-3 flex flex-wrap gap-x-4 gap-y-1.5 text-xs text-ink-soft" aria-label={`Legend: ${drawing.title}`}>
      {[...seen].map(([role, status]) => (
        <li key={role} className="inline-flex items-center gap-1.5">
          <Swatch role={role} status={status} />
          {roleLegend[role]}
        </li>
      ))}
      {statuses.has('fail') && (
        <li className="inline-flex items-center gap-1.5"><StatusMark status="fail" className="h-3.5 w-3.5" />Fails the check</li>
      )}
      {statuses.has('caution') && (
        <li className="inline-flex items-center gap-1.5"><StatusMark status="caution" className="h-3.5 w-3.5" />Caution from the check</li>
      )}
    </ul>
  );
}
