import type { Drawing } from '@/lib/domain/drawing';
import { StatusMark } from '@/components/ui/status-badge';
import { labelForPath } from '@/lib/domain/plan';
import { DrawingLegend } from '@/components/drawings/drawing-legend';
import { DrawingSvg } from '@/components/drawings/drawing-svg';

const scaleLabel: Record<Drawing['scale'], string> = {
  'to-scale': 'to scale',
  schematic: 'schematic, lengths to scale along the bars',
  'full-size': 'full size, 1:1',
};

/** What the plan lacks for this drawing, in the plan editor's field names. */
export function MissingFields({ paths, what = 'drawing' }: { paths: string[]; what?: string }) {
  if (paths.length === 0) return null;
  return (
    <div role="note" className="mt-3 flex gap-2 rounded-md border border-status-info/40 bg-white px-3 py-2 text-sm" data-testid="drawing-missing">
      <StatusMark status="needs-info" className="mt-0.5 h-4 w-4" />
      <p>
        <span className="font-semibold">Not in the plan yet, so left out of this {what}:</span> {paths.map(labelForPath).join('; ')}.
      </p>
    </div>
  );
}

export function DrawingNotes({ notes }: { notes: string[] }) {
  if (notes.length === 0) return null;
  return (
    <ul className="mt-3 list-disc space-y-1 pl-5 text-sm text-ink-soft">
      {notes.map((note) => (
        <li key={note}>{note}</li>
      ))}
    </ul>
  );
}

/** A titled drawing with its legend, what is missing, its notes and the caution. */
export function DrawingFigure({ drawing, id, children }: { drawing: Drawing; id: string; children?: React.ReactNode }) {
  return (
    <figure className="card break-inside-avoid p-4 sm:p-5" aria-labelledby={`${id}-caption`} data-testid={`figure-${drawing.kind}`}>
      <figcaption className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <span id={`${id}-caption`} className="text-lg font-bold">{drawing.title}</span>
        <span className="text-xs font-semibold uppercase tracking-wide text-ink-faint">{scaleLabel[drawing.scale]}</span>
      </figcaption>
      <div className="rounded-md border border-rule bg-white p-2">
        <DrawingSvg drawing={drawing} id={id} />
      </div>
      <DrawingLegend drawing={drawing} />
      <MissingFields paths={drawing.missing} />
      <DrawingNotes notes={drawing.notes} />
      {children}
      <p className="mt-3 text-xs text-ink-faint">{drawing.caution}</p>
    </figure>
  );
}
