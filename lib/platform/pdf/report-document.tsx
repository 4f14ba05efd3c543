import path from 'node:path';
import type { ReactNode } from 'react';
import { Document, Font, Image, Page, Path, Rect, StyleSheet, Svg, Text, View } from '@react-pdf/renderer';
import { drawPlan, type Drawing, type DoorHingeLayout, type PlanDrawings } from '@/lib/domain/drawing';
import type { Finding } from '@/lib/domain/engine';
import { PdfDrawing } from '@/lib/platform/pdf/pdf-drawing';
import { labelForPath } from '@/lib/domain/plan';
import type { ReportData } from '@/lib/domain/reports/report-data';
import { formatDate, formatDateTime } from '@/lib/domain/dates/format';
import { formatLength, type UnitSystem } from '@/lib/domain/units';
import { areaTitles as areaTitle, citationText, findingStatusLabels } from '@/lib/domain/vocabulary';
import { amendmentCitationText, checkedOnFor, citationStatusText } from '@/lib/domain/rule-sets/citation-checks';

// Full (not subset) font files: the PDF font engine needs complete glyph tables.
const fontDir = path.join(process.cwd(), 'public', 'fonts', 'pdf');
let fontsRegistered = false;
export function registerReportFonts() {
  if (fontsRegistered) return;
  Font.register({
    family: 'Plex',
    fonts: [
      { src: path.join(fontDir, 'IBMPlexSans-Regular.ttf'), fontWeight: 400 },
      { src: path.join(fontDir, 'IBMPlexSans-Italic.ttf'), fontWeight: 400, fontStyle: 'italic' },
      { src: path.join(fontDir, 'IBMPlexSans-SemiBold.ttf'), fontWeight: 600 },
      { src: path.join(fontDir, 'IBMPlexSans-Bold.ttf'), fontWeight: 700 },
    ],
  });
  Font.register({ family: 'PlexMono', fonts: [{ src: path.join(fontDir, 'IBMPlexMono-Regular.ttf'), fontWeight: 400 }] });
  // Codes and section numbers must never be split by hyphenation.
  Font.registerHyphenationCallback((word) => [word]);
  fontsRegistered = true;
}

const ink = '#1c2a3a';
const soft = '#3d4d60';
const faint = '#6b7785';
const rule = '#d6d0c2';
const brass = '#a8741a';
const statusColour: Record<Finding['status'], string> = {
  pass: '#2e7d5b',
  fail: '#b23a2a',
  caution: '#b8860b',
  'needs-info': '#4a58b8',
  'not-applicable': '#7a7f86',
};

const s = StyleSheet.create({
  page: { fontFamily: 'Plex', fontSize: 9, color: ink, paddingTop: 42, paddingBottom: 56, paddingHorizontal: 42 },
  kicker: { fontSize: 8, color: brass, letterSpacing: 1.2, textTransform: 'uppercase', fontWeight: 600 },
  h1: { fontSize: 20, fontWeight: 700, marginTop: 4, marginBottom: 2 },
  h2: { fontSize: 13, fontWeight: 700, marginTop: 14, marginBottom: 6 },
  h3: { fontSize: 10.5, fontWeight: 700, marginTop: 10, marginBottom: 4 },
  muted: { color: soft },
  faint: { color: faint, fontSize: 8 },
  grid: { flexDirection: 'row', flexWrap: 'wrap', marginTop: 8 },
  cell: { width: '50%', paddingVertical: 3, paddingRight: 8 },
  label: { fontSize: 7.5, color: faint, textTransform: 'uppercase', letterSpacing: 0.6 },
  value: { fontSize: 9.5 },
  box: { borderWidth: 1, borderColor: rule, borderRadius: 3, padding: 8, marginTop: 8 },
  caution: { borderLeftWidth: 3, borderLeftColor: brass, backgroundColor: '#f3e6c8', padding: 8, marginTop: 10 },
  row: { flexDirection: 'row', borderBottomWidth: 0.5, borderBottomColor: rule, paddingVertical: 4 },
  th: { fontSize: 7.5, color: faint, textTransform: 'uppercase', fontWeight: 600 },
  footer: { position: 'absolute', bottom: 24, left: 42, right: 42, flexDirection: 'row', justifyContent: 'space-between', fontSize: 7.5, color: faint, borderTopWidth: 0.5, borderTopColor: rule, paddingTop: 4 },
  mono: { fontFamily: 'PlexMono', fontSize: 8 },
});

function StatusMark({ status, size = 8 }: { status: Finding['status']; size?: number }) {
  const c = statusColour[status];
  return (
    <Svg width={size} height={size} viewBox="0 0 16 16">
      {status === 'pass' && <Path d="M8 1.5 A6.5 6.5 0 1 1 7.99 1.5 Z" fill={c} />}
      {status === 'fail' && (
        <>
          <Rect x={1.5} y={1.5} width={13} height={13} fill={c} />
          <Path d="M5 5 L11 11 M11 5 L5 11" stroke="#ffffff" strokeWidth={2} />
        </>
      )}
      {status === 'caution' && <Path d="M8 1.5 L15 14.5 L1 14.5 Z" fill={c} />}
      {status === 'needs-info' && <Path d="M8 1.5 L14.5 8 L8 14.5 L1.5 8 Z" fill="none" stroke={c} strokeWidth={2} />}
      {status === 'not-applicable' && <Path d="M3 8 L13 8" stroke={c} strokeWidth={2.5} />}
    </Svg>
  );
}

function Field({ label, value }: { label: string; value: string }) {
  return (
    <View style={s.cell}>
      <Text style={s.label}>{label}</Text>
      <Text style={s.value}>{value}</Text>
    </View>
  );
}


/** A length as the web's hinge table writes it: the plan's units, imperial plans with millimetres beside. */
function lengthText(inches: number | null, units: UnitSystem): string {
  if (inches === null) return 'not known';
  return units === 'metric' ? formatLength(inches, 'metric') : `${formatLength(inches, 'imperial')} (${formatLength(inches, 'metric')})`;
}

// The page box inside the margins (LETTER, 612 × 792 pt, less the page padding): no block may be taller,
// and a drawing takes at most about a third of it, so drawings share pages with what comes before and after.
const CONTENT_WIDTH_PT = 612 - 2 * 42;
const DRAWING_HEIGHT_PT = 250;
const citation = citationText;
const statusShort = Object.fromEntries(Object.entries(findingStatusLabels).map(([k, v]) => [k, v.short])) as Record<Finding['status'], string>;

function Footer({ code }: { code: string }) {
  return (
    <View style={s.footer} fixed>
      <Text>NookPass report {code}</Text>
      <Text render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
    </View>
  );
}

const SAFETY =
  'This report records a check of the installer’s plan against the rules the jurisdiction’s administrator recorded in NookPass. The locally adopted code, the authority having jurisdiction (AHJ) and licensed trades govern; the appliance makers’ installation instructions apply alongside the code. Lint in a dryer exhaust can catch fire; a gas dryer can produce carbon monoxide; receptacles and dryer circuits carry shock risk; a leaking washer can damage the structure. Gas and electrical work belong to licensed trades, and only the inspection approves the work.';

function MissingLine({ paths }: { paths: string[] }) {
  if (paths.length === 0) return null;
  return <Text style={s.faint}>Not in the plan yet, so left out of this drawing: {paths.map(labelForPath).join('; ')}.</Text>;
}

/** One drawing and its title, kept whole and scaled into its box; its notes may flow on to the next page. */
function DrawingBlock({ drawing, widthPt, heightPt, heading }: { drawing: Drawing; widthPt: number; heightPt: number; heading?: ReactNode }) {
  return (
    <View>
      <View wrap={false}>
        {heading}
        <Text style={s.h3}>{drawing.title}</Text>
        <PdfDrawing drawing={drawing} maxWidthPt={widthPt} maxHeightPt={heightPt} />
      </View>
      <MissingLine paths={drawing.missing} />
      {drawing.notes.map((n, i) => <Text key={i} style={s.faint}>{n}</Text>)}
    </View>
  );
}

function HingeDoor({ layout, units, heading }: { layout: DoorHingeLayout; units: UnitSystem; heading?: ReactNode }) {
  const cell = { fontSize: 7.5 };
  return (
    <View style={{ marginBottom: 8 }}>
      <View wrap={false}>
        {heading}
        <Text style={s.h3}>Door {layout.doorIndex + 1} — hinges on the {layout.hingeSide} edge</Text>
        <View style={{ flexDirection: 'row', gap: 12 }}>
          <PdfDrawing drawing={layout.overview} maxWidthPt={170} maxHeightPt={210} />
          <View style={{ flex: 1 }}>
            {layout.positions.length > 0 && (
              <>
                <View style={[s.row, { borderBottomWidth: 1, paddingVertical: 2 }]}>
                  <Text style={[s.th, { width: '14%' }]}>Hinge</Text>
                  <Text style={[s.th, { width: '43%' }]}>Cup centre from door top</Text>
                  <Text style={[s.th, { width: '43%' }]}>Plate from top of opening</Text>
                </View>
                {layout.positions.map((p) => (
                  <View key={p.number} style={[s.row, { paddingVertical: 1.5 }]}>
                    <Text style={{ ...cell, width: '14%' }}>{p.number}</Text>
                    <Text style={{ ...cell, width: '43%' }}>{lengthText(p.fromDoorTopIn, units)}</Text>
                    <Text style={{ ...cell, width: '43%' }}>{lengthText(p.plateFromOpeningTopIn, units)}</Text>
                  </View>
                ))}
                <Text style={{ ...cell, marginTop: 3 }}>Plate centre line {lengthText(layout.plateSetbackIn, units)} from the front edge.</Text>
              </>
            )}
          </View>
        </View>
      </View>
      {layout.notes.map((n, i) => <Text key={i} style={s.faint}>{n}</Text>)}
      {layout.missing.length > 0 && <Text style={s.faint}>Not in the plan yet: {layout.missing.map(labelForPath).join('; ')}.</Text>}
    </View>
  );
}

/**
 * The drawings and hinge layout, in the flow after the findings. Each drawing is scaled into half a
 * page box and kept whole (wrap={false}), a heading travels with its first block, so no page is left
 * with a heading or a sliver of content.
 */
function DrawingSections({ drawings, units }: { drawings: PlanDrawings; units: UnitSystem }) {
  const { elevation, planView: topView, exhaust: schematic, hinges } = drawings;
  const half = (CONTENT_WIDTH_PT - 12) / 2;
  const hingeHeading = <Text style={s.h2}>Hinge layout</Text>;
  return (
    <>
      {/* The heading and both views stay together; their notes follow and may run on. */}
      <View wrap={false}>
        <Text style={s.h2}>Closet drawings</Text>
        <Text style={s.faint}>{elevation.caution}</Text>
        <View style={{ flexDirection: 'row', gap: 12, marginTop: 4 }}>
          {[elevation, topView].map((d) => (
            <View key={d.kind} style={{ width: half }}>
              <Text style={s.h3}>{d.title}</Text>
              <PdfDrawing drawing={d} maxWidthPt={half} maxHeightPt={DRAWING_HEIGHT_PT} />
            </View>
          ))}
        </View>
      </View>
      {/* Both views share most of their assumptions: each note once. */}
      <MissingLine paths={[...new Set([...elevation.missing, ...topView.missing])]} />
      {[...new Set([...elevation.notes, ...topView.notes])].map((n, i) => <Text key={i} style={s.faint}>{n}</Text>)}
      <DrawingBlock drawing={schematic} widthPt={CONTENT_WIDTH_PT} heightPt={DRAWING_HEIGHT_PT - 30} />

      {hinges.length === 0 ? (
        <View wrap={false}>
          {hingeHeading}
          <Text style={s.muted}>The plan has no hinged enclosure doors, so there is no hinge layout.</Text>
        </View>
      ) : (
        hinges.map((h, i) => <HingeDoor key={h.doorIndex} layout={h} units={units} heading={i === 0 ? hingeHeading : undefined} />)
      )}
      <Text style={s.faint}>Full-size drilling templates print from the project’s Drawing page in NookPass.</Text>
    </>
  );
}

export function ReportDocument({ data, verifyQr }: { data: ReportData; verifyQr: Buffer }) {
  // Every date in the report is on the jurisdiction's clock, with the zone's abbreviation.
  const zone = data.jurisdiction.timeZone;
  const fmtDate = (d: Date | null | undefined, none = 'not recorded') => (d ? formatDateTime(d, zone) : none);
  const order = Object.keys(areaTitle);
  const byArea = order
    .map((area) => ({ area, items: data.findings.filter((f) => f.area === area) }))
    .filter((g) => g.items.length > 0);
  const withheld = data.drawingsWithheld ?? [];
  const drawn = withheld.length > 0 ? ({ ok: false, reasons: withheld } as const) : drawPlan(data.plan, { params: data.parameters, marks: data.findings });
  const e = data.jurisdiction.editions;
  const sum = data.check.summary;

  const tableHead = (
    <View style={[s.row, { borderBottomWidth: 1 }]}>
      <Text style={[s.th, { width: '12%' }]}>Status</Text>
      <Text style={[s.th, { width: '40%' }]}>Rule and finding</Text>
      <Text style={[s.th, { width: '20%' }]}>Citation</Text>
      <Text style={[s.th, { width: '14%' }]}>Measured</Text>
      <Text style={[s.th, { width: '14%' }]}>Limit</Text>
    </View>
  );
  const findingRow = (f: Finding) => (
    <View key={f.ruleKey} style={s.row} wrap={false}>
      <View style={{ width: '12%', flexDirection: 'row', gap: 3, alignItems: 'center' }}>
        <StatusMark status={f.status} />
        <Text style={{ fontSize: 7.5, fontWeight: 700, color: statusColour[f.status] }}>{statusShort[f.status]}</Text>
      </View>
      <View style={{ width: '40%', paddingRight: 6 }}>
        <Text style={{ fontWeight: 600 }}>{f.title}</Text>
        <Text style={s.muted}>{f.message}</Text>
        {f.remedy ? <Text style={{ marginTop: 2 }}>Smallest fix: {f.remedy}</Text> : null}
        {f.missing.length > 0 ? <Text style={{ color: statusColour['needs-info'] }}>Missing: {f.missing.map(labelForPath).join('; ')}</Text> : null}
      </View>
      <View style={{ width: '20%', paddingRight: 4 }}>
        <Text style={s.mono}>{citation(f.citation)}</Text>
        {amendmentCitationText(f) ? <Text style={s.faint}>Local amendment {amendmentCitationText(f)}</Text> : null}
        <Text style={s.faint}>{citationStatusText(f.citation, checkedOnFor(f, data.citationChecks), (at) => formatDate(at, zone))}</Text>
      </View>
      <Text style={{ width: '14%' }}>{f.display.measured ?? '—'}</Text>
      <Text style={{ width: '14%' }}>{f.display.limit ?? '—'}</Text>
    </View>
  );

  return (
    <Document title={`NookPass report ${data.code} — ${data.project.name}`} author={data.organization.name} subject="Laundry closet check report" creator="NookPass" producer="NookPass">
      <Page size="LETTER" style={s.page}>
        <Text style={s.kicker}>NookPass · laundry closet check report{data.project.isDemo ? ' · DEMO DATA (invented)' : ''}</Text>
        <Text style={s.h1}>{data.project.name}</Text>
        <Text style={s.muted}>{data.project.siteAddress}</Text>

        <View style={{ ...s.box, flexDirection: 'row', gap: 12, alignItems: 'center' }}>
          {/* The printed address below says what the code holds; a PDF image has no alt text. */}
          {/* eslint-disable-next-line jsx-a11y/alt-text */}
          <Image src={verifyQr} style={{ width: 84, height: 84 }} />
          <View style={{ flex: 1 }}>
            <Text style={s.label}>Report code</Text>
            <Text style={{ ...s.mono, fontSize: 13 }}>{data.code}</Text>
            <Text style={{ ...s.label, marginTop: 6 }}>Verify at</Text>
            <Text style={s.value}>{data.verifyUrl}</Text>
            <Text style={{ ...s.faint, marginTop: 4 }}>Scan the code or open the address to see the report NookPass recorded and to check that this file is unaltered.</Text>
          </View>
        </View>

        <View style={s.grid}>
          <Field label="Jurisdiction (AHJ)" value={`${data.jurisdiction.name}, ${data.jurisdiction.region}`} />
          <Field label="Permit number" value={data.project.permitNumber ?? 'not given'} />
          <Field label="Adopted editions" value={`${e.building}; ${e.electrical}; ${e.plumbing} (${e.plumbingFamily}); ${e.mechanical}; ${e.fuelGas}`} />
          <Field label="Rule set" value={`Version ${data.ruleSet.version}, published ${fmtDate(data.ruleSet.publishedAt, 'not yet')}`} />
          <Field label="Plan revision" value={`${data.planRevision.number}, saved ${fmtDate(data.planRevision.savedAt)} by ${data.planRevision.savedBy ?? 'a former user'}`} />
          <Field label="Check" value={`${fmtDate(data.check.createdAt)}, run by ${data.check.runBy ?? 'a former user'}`} />
          <Field label="Issued" value={`${fmtDate(data.generatedAt)} (times in ${zone})`} />
          <Field label="Installer company" value={data.organization.name} />
          <Field label="Contractor licence number" value={data.organization.licenseNumber ?? '________________________'} />
        </View>

        <Text style={s.h2}>Summary</Text>
        <View style={{ flexDirection: 'row', gap: 10 }}>
          {(
            [
              ['fail', sum.fail, 'fail'],
              ['caution', sum.caution, 'cautions'],
              ['needs-info', sum.needsInfo, 'need information'],
              ['pass', sum.pass, 'pass'],
              ['not-applicable', sum.notApplicable, 'not applicable'],
            ] as const
          ).map(([status, n, label]) => (
            <View key={status} style={{ ...s.box, marginTop: 0, flexDirection: 'row', alignItems: 'center', gap: 4 }}>
              <StatusMark status={status} size={10} />
              <Text style={{ fontSize: 14, fontWeight: 700 }}>{n}</Text>
              <Text style={s.muted}>{label}</Text>
            </View>
          ))}
        </View>
        <Text style={{ marginTop: 8 }}>
          {sum.fail > 0
            ? `The plan does not meet ${sum.fail} rule${sum.fail === 1 ? '' : 's'} of this rule set; each failure below gives the smallest change that would pass.`
            : sum.needsInfo > 0
              ? 'No rule fails, but some could not be checked because the plan lacks information; they are listed below.'
              : 'Every rule that applies passes, or carries a caution for the inspector to confirm.'}
        </Text>
        {data.jurisdiction.amendmentNotes ? <Text style={{ ...s.faint, marginTop: 6 }}>Local notes: {data.jurisdiction.amendmentNotes}</Text> : null}
        {data.ruleSet.changelog ? <Text style={{ ...s.faint, marginTop: 2 }}>Rule set note: {data.ruleSet.changelog}</Text> : null}
        <View style={s.caution}><Text>{SAFETY}</Text></View>
        <Text style={{ ...s.faint, marginTop: 6 }}>
          Status marks: filled circle = pass, square with a cross = fails, triangle = caution, open diamond = needs information, dash = not applicable.
          Beside each citation: whether the jurisdiction has checked it against its adopted code, and on which date. Confirm citations not yet checked with the AHJ; the locally adopted code and its amendments govern.
        </Text>
        <Footer code={data.code} />
      </Page>

      {/* Everything after the cover flows on as one text: sections follow each other, blocks stay whole. */}
      <Page size="LETTER" style={s.page} wrap>
        <Text style={s.h2} minPresenceAhead={120}>Findings</Text>
        {byArea.map(({ area, items }) => (
          <View key={area}>
            {/* The area's heading, the column heads and its first finding stay together. */}
            <View wrap={false}>
              <Text style={s.h3}>{areaTitle[area] ?? area}</Text>
              {tableHead}
              {findingRow(items[0])}
            </View>
            {items.slice(1).map(findingRow)}
          </View>
        ))}

        {drawn.ok ? (
          <DrawingSections drawings={drawn.drawings} units={data.plan.units} />
        ) : (
          <View wrap={false}>
            <Text style={s.h2}>Closet drawings</Text>
            <View style={s.caution}>
              <Text style={{ fontWeight: 700 }}>Plan revision {data.planRevision.number} is too large to draw, so this report has no drawings or hinge layout.</Text>
              {drawn.reasons.map((r, i) => <Text key={i}>{r}</Text>)}
            </View>
            <Text style={{ marginTop: 8 }}>
              The findings above are those of the stored check. Correct the plan in NookPass and save it as a new revision to get its drawings; this revision stays as it was saved.
            </Text>
          </View>
        )}

        {data.photos.length > 0 && (
          <>
            <Text style={s.h2} minPresenceAhead={200}>Photos</Text>
            <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: 12 }}>
              {data.photos.map((p, i) => {
                const w = 250;
                const h = Math.min(240, (w * p.height) / Math.max(1, p.width));
                return (
                  <View key={i} wrap={false} style={{ width: w }}>
                    {/* A PDF image has no alt text; the caption printed under it says what it shows. */}
                    {/* eslint-disable-next-line jsx-a11y/alt-text */}
                    <Image src={p.image} style={{ width: w, height: h, objectFit: 'contain' }} />
                    <Text style={{ marginTop: 2 }}>{p.caption || p.filename}</Text>
                    {p.addedAt ? <Text style={s.faint}>Added {fmtDate(p.addedAt)}</Text> : null}
                  </View>
                );
              })}
            </View>
          </>
        )}
        {data.documents.length > 0 && (
          <View wrap={false}>
            <Text style={s.h3}>Documents on file</Text>
            {data.documents.map((d, i) => (
              <Text key={i}>
                {d.caption || d.filename} ({d.filename}){d.addedAt ? `, added ${fmtDate(d.addedAt)}` : ''}
              </Text>
            ))}
          </View>
        )}

        <View wrap={false}>
          <Text style={s.h2}>Statement and signatures</Text>
          <View style={s.caution}><Text>{SAFETY}</Text></View>
          <Text style={{ marginTop: 10 }}>
            The installer states that the plan described in this report is the work as {data.check.outcome === 'pass' ? 'planned or built' : 'planned'} at {data.project.siteAddress}, and that
            the appliance makers’ installation instructions are available to the inspector on site.
          </Text>
          {[['Installer', `${data.preparedBy}, ${data.organization.name}`], ['Inspector', data.jurisdiction.name]].map(([who, line]) => (
            <View key={who} style={{ marginTop: 28 }}>
              <View style={{ borderBottomWidth: 0.8, borderBottomColor: ink, height: 24 }} />
              <View style={{ flexDirection: 'row', justifyContent: 'space-between' }}>
                <Text style={s.faint}>{who} signature — {line}</Text>
                <Text style={s.faint}>Date</Text>
              </View>
            </View>
          ))}
          <Text style={{ ...s.faint, marginTop: 24 }}>
            Report {data.code} was issued {fmtDate(data.generatedAt)}. NookPass records the SHA-256 of this file; drop the file on {data.verifyUrl} to confirm it is unaltered.
          </Text>
        </View>
        <Footer code={data.code} />
      </Page>
    </Document>
  );
}
