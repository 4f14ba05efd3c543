import { dimensionGeometry, type Drawing, type MarkShape, type Point, type Shape } from '@/lib/domain/drawing';
import { hatchStroke, roleStyle, statusFill, statusStroke, type HatchName } from '@/components/drawings/drawing-style';

const HATCHES: HatchName[] = ['zone', 'kick', 'transition', 'fail', 'caution'];

/** One line unit: about a pixel on screen, 0.25 mm on a full-size sheet. */
function lineUnit(drawing: Drawing): number {
  return drawing.scale === 'full-size' ? 0.01 : Math.max(drawing.width, drawing.height) / 700;
}

function hatchFor(shape: Shape): HatchName | undefined {
  if (shape.status && (shape.role === 'clearance-fail' || shape.role === 'rear-zone' || shape.role === 'toe-kick' || shape.role === 'hinge-arm-zone')) return shape.status;
  return roleStyle[shape.role].hatch;
}

function strokeProps(shape: Shape, u: number) {
  const style = roleStyle[shape.role];
  const dash = shape.dashed && !style.dash ? [5, 3] : style.dash;
  return {
    className: shape.status ? statusStroke[shape.status] : style.stroke,
    strokeWidth: style.weight * u * (shape.status ? 1.3 : 1),
    strokeDasharray: dash?.map((d) => d * u).join(' '),
  };
}

function Mark({ shape, u }: { shape: MarkShape; u: number }) {
  const [x, y] = shape.at;
  const h = shape.size / 2;
  if (shape.status === 'fail') {
    const k = h * 0.45;
    return (
      <g>
        <rect x={x - h} y={y - h} width={h * 2} height={h * 2} rx={h * 0.2} className={statusFill.fail} />
        <path d={`M${x - k} ${y - k}L${x + k} ${y + k}M${x + k} ${y - k}L${x - k} ${y + k}`} className="stroke-white" strokeWidth={Math.max(u * 1.6, h * 0.28)} strokeLinecap="round" />
      </g>
    );
  }
  return <path d={`M${x} ${y - h}L${x + h} ${y + h * 0.85}L${x - h} ${y + h * 0.85}Z`} className={statusFill.caution} />;
}

function pointsAttr(points: readonly Point[]): string {
  return points.map(([x, y]) => `${x},${y}`).join(' ');
}

function ShapeElement({ shape, u, hatchId }: { shape: Shape; u: number; hatchId: (name: HatchName) => string }) {
  const style = roleStyle[shape.role];
  switch (shape.kind) {
    case 'rect': {
      const hatch = hatchFor(shape);
      // A dashed outline is hidden or assumed (a stacked unit, a door over the units): never filled.
      const fill = shape.dashed ? 'fill-none' : style.fill;
      return (
        <g>
          <rect x={shape.x} y={shape.y} width={Math.max(0, shape.width)} height={Math.max(0, shape.height)} className={fill} fillOpacity={style.fillOpacity} />
          {hatch && <rect x={shape.x} y={shape.y} width={Math.max(0, shape.width)} height={Math.max(0, shape.height)} fill={`url(#${hatchId(hatch)})`} />}
          <rect x={shape.x} y={shape.y} width={Math.max(0, shape.width)} height={Math.max(0, shape.height)} fill="none" {...strokeProps(shape, u)} />
        </g>
      );
    }
    case 'line':
      return <line x1={shape.from[0]} y1={shape.from[1]} x2={shape.to[0]} y2={shape.to[1]} strokeLinecap="round" {...strokeProps(shape, u)} />;
    case 'polyline':
      return shape.closed ? (
        <polygon points={pointsAttr(shape.points)} {...strokeProps(shape, u)} className={`${style.fill} ${strokeProps(shape, u).className}`} />
      ) : (
        <polyline points={pointsAttr(shape.points)} fill="none" strokeLinejoin="round" strokeLinecap="round" {...strokeProps(shape, u)} />
      );
    case 'arc': {
      const at = (deg: number): Point => [shape.centre[0] + shape.radius * Math.cos((deg * Math.PI) / 180), shape.centre[1] + shape.radius * Math.sin((deg * Math.PI) / 180)];
      const [x1, y1] = at(shape.startDeg);
      const [x2, y2] = at(shape.endDeg);
      const large = shape.endDeg - shape.startDeg > 180 ? 1 : 0;
      // Angles grow clockwise on the page, which is SVG's positive sweep.
      return <path d={`M${x1} ${y1}A${shape.radius} ${shape.radius} 0 ${large} 1 ${x2} ${y2}`} fill="none" {...strokeProps(shape, u)} />;
    }
    case 'circle':
      return <circle cx={shape.centre[0]} cy={shape.centre[1]} r={shape.radius} {...strokeProps(shape, u)} className={`${style.fill} ${strokeProps(shape, u).className}`} />;
    case 'text':
      return (
        <text
          x={shape.at[0]}
          y={shape.at[1]}
          fontSize={shape.size}
          textAnchor={shape.anchor}
          fontWeight={shape.weight === 'bold' ? 700 : 400}
          className={`${shape.status ? statusFill[shape.status] : (style.text ?? 'fill-ink')} stroke-white`}
          strokeWidth={shape.size * 0.22}
          paintOrder="stroke"
        >
          {shape.text}
        </text>
      );
    case 'dimension': {
      const g = dimensionGeometry(shape);
      const stroke = strokeProps(shape, u);
      const dot = Math.max(u * 1.8, shape.size * 0.09);
      return (
        <g>
          {shape.offset !== 0 && (
            <>
              <line x1={shape.from[0]} y1={shape.from[1]} x2={g.from[0]} y2={g.from[1]} {...stroke} strokeDasharray={`${u * 2} ${u * 2}`} />
              <line x1={shape.to[0]} y1={shape.to[1]} x2={g.to[0]} y2={g.to[1]} {...stroke} strokeDasharray={`${u * 2} ${u * 2}`} />
            </>
          )}
          <line x1={g.from[0]} y1={g.from[1]} x2={g.to[0]} y2={g.to[1]} {...stroke} />
          <circle cx={g.from[0]} cy={g.from[1]} r={dot} className={shape.status ? statusFill[shape.status] : 'fill-ink-soft'} />
          <circle cx={g.to[0]} cy={g.to[1]} r={dot} className={shape.status ? statusFill[shape.status] : 'fill-ink-soft'} />
          <text
            x={g.labelAt[0]}
            y={g.labelAt[1]}
            fontSize={shape.size}
            textAnchor="middle"
            transform={g.angleDeg !== 0 ? `rotate(${g.angleDeg} ${g.labelAt[0]} ${g.labelAt[1]})` : undefined}
            className={`${shape.status ? statusFill[shape.status] : 'fill-ink-soft'} stroke-white`}
            strokeWidth={shape.size * 0.25}
            paintOrder="stroke"
          >
            {shape.label}
          </text>
        </g>
      );
    }
    case 'mark':
      return <Mark shape={shape} u={u} />;
  }
}

/**
 * Renders a drawing as SVG. A full-size drawing gets its width and height in inches, so it
 * prints at 1:1; others scale to the width they are given.
 */
export function DrawingSvg({ drawing, id, className }: { drawing: Drawing; id: string; className?: string }) {
  const u = lineUnit(drawing);
  const hatchId = (name: HatchName) => `${id}-hatch-${name}`;
  const spacing = u * 7;
  const fullSize = drawing.scale === 'full-size';
  return (
    <svg
      viewBox={`0 0 ${drawing.width} ${drawing.height}`}
      width={fullSize ? `${drawing.width}in` : '100%'}
      height={fullSize ? `${drawing.height}in` : undefined}
      preserveAspectRatio="xMidYMid meet"
      role="img"
      aria-labelledby={`${id}-title`}
      className={`font-sans ${fullSize ? 'block' : 'block h-auto max-h-[75vh] w-full print:max-h-[8.5in]'} ${className ?? ''}`}
      data-drawing={drawing.kind}
      data-scale={drawing.scale}
    >
      <title id={`${id}-title`}>{drawing.title}</title>
      <defs>
        {HATCHES.map((name) => (
          <pattern key={name} id={hatchId(name)} patternUnits="userSpaceOnUse" width={spacing} height={spacing} patternTransform={`rotate(${name === 'kick' ? -45 : 45})`}>
            <line x1={0} y1={0} x2={0} y2={spacing} className={hatchStroke[name]} strokeWidth={u * (name === 'fail' || name === 'caution' ? 1.4 : 0.8)} />
          </pattern>
        ))}
      </defs>
      {drawing.shapes.map((shape, i) => (
        <ShapeElement key={i} shape={shape} u={u} hatchId={hatchId} />
      ))}
    </svg>
  );
}
