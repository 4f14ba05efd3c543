import { Circle, G, Line, Path, Polyline, Rect, Svg, Text as SvgText } from '@react-pdf/renderer';
import { dimensionGeometry, type Drawing, type Shape } from '@/lib/domain/drawing';

// The same role colours as the web drawings (components/drawings), so paper and screen agree.
const stroke: Partial<Record<Shape['role'], string>> = {
  enclosure: '#1c2a3a',
  panel: '#3d4d60',
  washer: '#1c2a3a',
  dryer: '#1c2a3a',
  'clearance-fail': '#b23a2a',
  'over-limit': '#b23a2a',
  door: '#6b7785',
  'door-swing': '#6b7785',
  duct: '#1c2a3a',
  transition: '#6b7785',
  fitting: '#a8741a',
  dimension: '#3d4d60',
  hinge: '#1c2a3a',
  cup: '#1c2a3a',
  plate: '#a8741a',
  hole: '#1c2a3a',
  'centre-line': '#a8741a',
  limit: '#b8860b',
};
const fill: Partial<Record<Shape['role'], string>> = {
  washer: '#ece8dd',
  dryer: '#ece8dd',
  clearance: '#e3eee8',
  'clearance-fail': '#f4dcd8',
  'rear-zone': '#f3e6c8',
  'hinge-arm-zone': '#e6e8f5',
  'toe-kick': '#d6d0c2',
  floor: '#d6d0c2',
  'scale-bar': '#1c2a3a',
};

function colourOf(s: Shape): { stroke: string; fill: string } {
  const failing = s.status === 'fail';
  const caution = s.status === 'caution';
  return {
    stroke: failing ? '#b23a2a' : caution ? '#b8860b' : (stroke[s.role] ?? '#3d4d60'),
    fill: fill[s.role] ?? 'none',
  };
}

function arcPath(cx: number, cy: number, r: number, a0: number, a1: number): string {
  const p = (a: number) => [cx + r * Math.cos((a * Math.PI) / 180), cy + r * Math.sin((a * Math.PI) / 180)];
  const [x0, y0] = p(a0);
  const [x1, y1] = p(a1);
  const large = Math.abs(a1 - a0) > 180 ? 1 : 0;
  return `M ${x0} ${y0} A ${r} ${r} 0 ${large} 1 ${x1} ${y1}`;
}

function renderShape(s: Shape, i: number, unit: number) {
  const { stroke: st, fill: fl } = colourOf(s);
  const width = (s.role === 'enclosure' || s.role === 'duct' ? 1.4 : 0.7) / unit;
  const dash = s.dashed ? `${3 / unit} ${2 / unit}` : undefined;
  switch (s.kind) {
    case 'rect':
      return <Rect key={i} x={s.x} y={s.y} width={s.width} height={s.height} stroke={st} strokeWidth={width} fill={fl} strokeDasharray={dash} />;
    case 'line':
      return <Line key={i} x1={s.from[0]} y1={s.from[1]} x2={s.to[0]} y2={s.to[1]} stroke={st} strokeWidth={width} strokeDasharray={dash} />;
    case 'polyline':
      return s.closed ? (
        <Path key={i} d={`M ${s.points.map((p) => p.join(' ')).join(' L ')} Z`} stroke={st} strokeWidth={width} fill={fl} strokeDasharray={dash} />
      ) : (
        <Polyline key={i} points={s.points.map((p) => p.join(',')).join(' ')} stroke={st} strokeWidth={width} fill="none" strokeDasharray={dash} />
      );
    case 'arc':
      return <Path key={i} d={arcPath(s.centre[0], s.centre[1], s.radius, s.startDeg, s.endDeg)} stroke={st} strokeWidth={width} fill="none" strokeDasharray={dash} />;
    case 'circle':
      return <Circle key={i} cx={s.centre[0]} cy={s.centre[1]} r={s.radius} stroke={st} strokeWidth={width} fill={fl} />;
    case 'text':
      return (
        <SvgText key={i} x={s.at[0]} y={s.at[1]} fill="#1c2a3a" style={{ fontSize: s.size, fontFamily: 'Plex', fontWeight: s.weight === 'bold' ? 700 : 400 }} textAnchor={s.anchor}>
          {s.text}
        </SvgText>
      );
    case 'dimension': {
      const g = dimensionGeometry(s);
      return (
        <G key={i}>
          <Line x1={g.from[0]} y1={g.from[1]} x2={g.to[0]} y2={g.to[1]} stroke={st} strokeWidth={0.5 / unit} />
          <Line x1={s.from[0]} y1={s.from[1]} x2={g.from[0]} y2={g.from[1]} stroke={st} strokeWidth={0.3 / unit} />
          <Line x1={s.to[0]} y1={s.to[1]} x2={g.to[0]} y2={g.to[1]} stroke={st} strokeWidth={0.3 / unit} />
          <G transform={`rotate(${g.angleDeg} ${g.labelAt[0]} ${g.labelAt[1]})`}>
            <SvgText x={g.labelAt[0]} y={g.labelAt[1]} fill="#1c2a3a" style={{ fontSize: s.size, fontFamily: 'Plex' }} textAnchor="middle">{s.label}</SvgText>
          </G>
        </G>
      );
    }
    case 'mark': {
      const h = s.size / 2;
      const [x, y] = s.at;
      return s.status === 'fail' ? (
        <G key={i}>
          <Rect x={x - h} y={y - h} width={s.size} height={s.size} fill="#b23a2a" />
          <Path d={`M ${x - h * 0.55} ${y - h * 0.55} L ${x + h * 0.55} ${y + h * 0.55} M ${x + h * 0.55} ${y - h * 0.55} L ${x - h * 0.55} ${y + h * 0.55}`} stroke="#ffffff" strokeWidth={s.size * 0.15} />
        </G>
      ) : (
        <Path key={i} d={`M ${x} ${y - h} L ${x + h} ${y + h} L ${x - h} ${y + h} Z`} fill="#b8860b" />
      );
    }
  }
}

/** A drawing scaled to fit `maxWidthPt` × `maxHeightPt` points on the page. */
export function PdfDrawing({ drawing, maxWidthPt, maxHeightPt }: { drawing: Drawing; maxWidthPt: number; maxHeightPt: number }) {
  const scale = Math.min(maxWidthPt / drawing.width, maxHeightPt / drawing.height);
  return (
    <Svg width={drawing.width * scale} height={drawing.height * scale} viewBox={`0 0 ${drawing.width} ${drawing.height}`}>
      {drawing.shapes.map((s, i) => renderShape(s, i, scale))}
    </Svg>
  );
}
