'use client';

import { useId, useState } from 'react';
import { useFormContext } from 'react-hook-form';
import type { Plan } from '@/lib/domain/plan';
import { editorListAt } from '@/lib/domain/plan';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { EnclosureSizing, Dimension } from '@/lib/domain/sizing';
import type { UnitSystem } from '@/lib/domain/units';
import { currentInside, formatLength, lengthFormText, MAX_PROPOSED_LEAVES, parseLength, proposeDoorLeaves } from '@/components/live-check/live-engine';

const other = (u: UnitSystem): UnitSystem => (u === 'imperial' ? 'metric' : 'imperial');

function Both({ inches, units }: { inches: number | null; units: UnitSystem }) {
  if (inches === null) return <span className="text-ink-faint">—</span>;
  return (
    <>
      <span className="font-mono">{formatLength(inches, units)}</span>{' '}
      <span className="font-mono text-xs text-ink-faint">({formatLength(inches, other(units))})</span>
    </>
  );
}

function Spare({ inches, units }: { inches: number | null; units: UnitSystem }) {
  if (inches === null) return <span className="text-ink-faint">enclosure size not given</span>;
  if (Math.abs(inches) < 1e-6) return <span className="font-semibold">exactly enough</span>;
  return inches > 0 ? (
    <span className="font-semibold text-status-pass"><Both inches={inches} units={units} /> to spare</span>
  ) : (
    <span className="font-semibold text-status-fail"><Both inches={-inches} units={units} /> short</span>
  );
}

const LABELS: Record<Dimension, string> = { width: 'Width', depth: 'Depth', height: 'Height' };

/** The smallest enclosure the rules allow for the chosen units, and how the plan's enclosure compares. */
export function SizesWorkedOut({ sizing, units }: { sizing: EnclosureSizing; units: UnitSystem }) {
  return (
    <section className="mt-4 border-t border-rule pt-3" aria-labelledby="live-sizes-title" data-testid="live-sizes">
      <h3 id="live-sizes-title" className="text-base font-bold">Sizes worked out</h3>
      <p className="text-xs text-ink-faint">From the units, their arrangement, the maker’s clearances and the panel thickness.</p>
      <dl className="mt-2 space-y-3 text-sm">
        {(['width', 'depth', 'height'] as const).map((dim) => (
          <div key={dim} data-testid={`size-${dim}`}>
            <dt className="font-semibold">{LABELS[dim]}</dt>
            <dd>
              Smallest passing every fail rule: <Both inches={sizing.smallestInside[dim]} units={units} /> inside
              {sizing.smallestOutside[dim] !== null && <>, <Both inches={sizing.smallestOutside[dim]} units={units} /> outside</>}
            </dd>
            <dd data-testid={`size-${dim}-all`}>
              Clearing the cautions too: <Both inches={sizing.comfortableInside[dim]} units={units} /> inside
              {sizing.comfortableOutside[dim] !== null && <>, <Both inches={sizing.comfortableOutside[dim]} units={units} /> outside</>}
            </dd>
            <dd data-testid={`size-${dim}-spare`}>
              Yours: <Spare inches={sizing.spare[dim]} units={units} /> for the fail rules; <Spare inches={sizing.spareComfortable[dim]} units={units} /> with the cautions
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

// A reveal of 1/8 in (3 mm) between leaves and at the edges: common practice, no published source.
const DEFAULT_REVEAL: Record<UnitSystem, string> = { imperial: '1/8', metric: '3' };

/** Door leaves for the opening and hinges for their height, which the installer can put into the plan. */
export function DoorLeavesProposal({
  params,
  plan,
  units,
  onAccept,
}: {
  params: RuleSetParameters;
  plan: Plan;
  units: UnitSystem;
  onAccept: (label: string, changes: Array<{ path: string; after: unknown }>) => void;
}) {
  const form = useFormContext();
  const id = useId();
  const [leaves, setLeaves] = useState(String(plan.doors?.length || 2));
  const [between, setBetween] = useState(DEFAULT_REVEAL[units]);
  const [edge, setEdge] = useState(DEFAULT_REVEAL[units]);
  const [height, setHeight] = useState('');

  const inside = currentInside(plan);
  const openingIn = plan.enclosure?.openingWidth ?? inside.width;
  const defaultHeightIn = plan.doors?.[0]?.height ?? (inside.height !== null ? inside.height - (plan.enclosure?.toeKick?.height ?? 0) : null);
  const read = (text: string, path: string) => {
    const r = parseLength(/^\d+(\.\d+)?$/.test(text.trim()) ? Number(text) : text, units, path);
    return r.ok ? r.value : null;
  };
  const heightIn = height.trim() ? read(height, 'leafHeight') : defaultHeightIn;
  const betweenIn = read(between, 'revealBetween');
  const edgeIn = read(edge, 'revealEdge');
  const proposal =
    openingIn == null || heightIn === null || betweenIn === null || edgeIn === null
      ? { ok: false as const, reason: openingIn == null ? 'Give the enclosure width (or its opening width) first.' : 'Give each size as a length.' }
      : proposeDoorLeaves({ openingWidthIn: openingIn, leaves: Number(leaves), revealBetweenIn: betweenIn, revealEdgeIn: edgeIn, leafHeightIn: heightIn, units }, params);

  function accept() {
    if (!proposal.ok) return;
    const blank = editorListAt('doors').newItem;
    const existing = (form.getValues('doors') as Array<Record<string, string>> | undefined) ?? [];
    const panel = form.getValues('enclosure.panelThickness') as string | undefined;
    const doors = proposal.leaves.map((leaf, i) => ({
      ...blank,
      ...existing[i],
      kind: existing[i]?.kind || 'hinged',
      thickness: existing[i]?.thickness || panel || blank.thickness,
      width: lengthFormText(leaf.widthIn, units),
      height: lengthFormText(leaf.heightIn, units),
      hinges: leaf.hingesIn.map((h) => lengthFormText(h, units)).join(', '),
    }));
    onAccept(`the doors to ${doors.length} leaves of ${formatLength(proposal.leafWidthIn, units)}`, [{ path: 'doors', after: doors }]);
  }

  const field = 'field-input mt-1 min-h-[44px]';
  return (
    <section className="mt-4 border-t border-rule pt-3" aria-labelledby={`${id}-title`} data-testid="door-proposal">
      <h3 id={`${id}-title`} className="text-base font-bold">Door leaves and hinges</h3>
      <p className="text-xs text-ink-faint">
        For the {openingIn != null ? formatLength(openingIn, units) : 'not yet known'} opening; hinges by the makers’ chart in this rule set.
      </p>
      <div className="mt-2 grid grid-cols-2 gap-2 text-sm">
        <label className="block">
          <span className="field-label">Leaves</span>
          <select className={field} value={leaves} onChange={(e) => setLeaves(e.target.value)}>
            {Array.from({ length: MAX_PROPOSED_LEAVES }, (_, i) => <option key={i + 1} value={i + 1}>{i + 1}</option>)}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Leaf height</span>
          <input className={field} inputMode="decimal" value={height} placeholder={defaultHeightIn != null ? lengthFormText(defaultHeightIn, units) : ''} onChange={(e) => setHeight(e.target.value)} />
        </label>
        <label className="block">
          <span className="field-label">Reveal between leaves</span>
          <input className={field} inputMode="decimal" value={between} onChange={(e) => setBetween(e.target.value)} />
        </label>
        <label className="block">
          <span className="field-label">Reveal at the edges</span>
          <input className={field} inputMode="decimal" value={edge} onChange={(e) => setEdge(e.target.value)} />
        </label>
      </div>
      {proposal.ok ? (
        <div className="mt-2 text-sm" data-testid="door-proposal-result">
          <p>
            {proposal.leaves.length} × <span className="font-mono">{formatLength(proposal.leafWidthIn, units)}</span> wide,{' '}
            <span className="font-mono">{formatLength(proposal.leaves[0].heightIn, units)}</span> high; {proposal.leaves[0].hingesIn.length} hinges each at{' '}
            <span className="font-mono">{proposal.leaves[0].hingesIn.map((h) => formatLength(h, units, 'inches')).join(', ')}</span> from the bottom.
          </p>
          <button type="button" className="btn-secondary mt-2 min-h-[44px] px-3 py-1 text-sm" onClick={accept}>Use these doors in the plan</button>
        </div>
      ) : (
        <p className="mt-2 text-sm text-ink-soft">{proposal.reason}</p>
      )}
    </section>
  );
}
