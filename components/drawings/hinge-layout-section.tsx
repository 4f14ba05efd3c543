import type { DoorHingeLayout } from '@/lib/domain/drawing';
import { formatLength, type UnitSystem } from '@/lib/domain/units';
import { DrawingFigure, DrawingNotes, MissingFields } from '@/components/drawings/drawing-figure';
import { DrawingSvg } from '@/components/drawings/drawing-svg';

function length(value: number | null, units: UnitSystem): string {
  if (value === null) return 'not known';
  return units === 'metric' ? formatLength(value, 'metric') : `${formatLength(value, 'imperial')} (${formatLength(value, 'metric')})`;
}

/** The hinge positions as a table, for reading on screen and for assistive technology. */
function PositionTable({ layout, units }: { layout: DoorHingeLayout; units: UnitSystem }) {
  if (layout.positions.length === 0) return null;
  return (
    // Focusable so a keyboard can scroll the table on a narrow screen.
    <div className="mt-4 overflow-x-auto" tabIndex={0} role="region" aria-label={`Door ${layout.doorIndex + 1} hinge positions`}>
      <table className="min-w-full text-sm">
        <caption className="sr-only">Door {layout.doorIndex + 1} hinge and plate positions</caption>
        <thead className="text-left text-xs uppercase tracking-wide text-ink-faint">
          <tr>
            <th className="py-1.5 pr-3">Hinge</th>
            <th className="pr-3">Cup centre from door top</th>
            <th className="pr-3">From door bottom (plan)</th>
            <th className="pr-3">Plate from top of opening</th>
            <th className="pr-3">Plate from top of panel</th>
            <th>Plate from front edge</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule font-mono text-xs">
          {layout.positions.map((p) => (
            <tr key={p.number}>
              <td className="py-1.5 pr-3">{p.number}</td>
              <td className="pr-3">{length(p.fromDoorTopIn, units)}</td>
              <td className="pr-3">{length(p.fromDoorBottomIn, units)}</td>
              <td className="pr-3">{length(p.plateFromOpeningTopIn, units)}</td>
              <td className="pr-3">{length(p.plateFromPanelTopIn, units)}</td>
              <td>{length(layout.plateSetbackIn, units)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** One hinged door: its to-scale layout on screen, then its full-size template on a sheet of its own. */
export function HingeLayoutSection({ layout, units }: { layout: DoorHingeLayout; units: UnitSystem }) {
  const n = layout.doorIndex + 1;
  const templateId = `door-${n}-template`;
  return (
    <section aria-labelledby={`door-${n}-h`} className="space-y-4" data-testid={`hinge-layout-${n}`}>
      <h3 id={`door-${n}-h`} className="sr-only">Door {n} hinge layout</h3>
      <DrawingFigure drawing={layout.overview} id={`door-${n}-overview`}>
        <PositionTable layout={layout} units={units} />
        <DrawingNotes notes={layout.notes} />
      </DrawingFigure>
      <div tabIndex={0} role="region" aria-label={`Door ${n} drilling template`} className="card overflow-x-auto p-4 print:overflow-visible print:border-0 print:p-0 print:shadow-none print:break-before-page">
        <p className="no-print mb-3 text-sm text-ink-soft">
          Door {n} drilling template. It prints at full size on its own Letter or A4 sheet; set the print scale to 100 % (actual size) and check the 100 mm bar with a rule before drilling.
        </p>
        <DrawingSvg drawing={layout.template} id={templateId} className="mx-auto bg-white" />
        <div className="no-print"><MissingFields paths={layout.template.missing} what="template" /></div>
      </div>
    </section>
  );
}
