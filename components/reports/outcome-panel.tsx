'use client';

import { useState } from 'react';
import { ReviewForm } from '@/components/reports/review-form';
import { StatusBadge } from '@/components/ui/status-badge';
import { OUTCOME_LABEL } from '@/lib/domain/reports/thread';
import type { ReviewOutcome } from '@/lib/domain/reports/review-schema';
import { formatDateTime } from '@/lib/domain/dates/format';

type Finding = { ruleKey: string; title: string; status: string };
export type StandingOutcome = { id: string; outcome: ReviewOutcome; comment: string; findingComments: Record<string, string>; inspectorName: string | null; createdAt: string };

/**
 * The inspector's outcome on what is under review. With nothing recorded it is the form; once an outcome
 * stands it shows that outcome (which, when, by whom) and the installer's latest note, and recording again
 * is an explicit "Revise outcome" that opens the form with the standing values.
 */
export function OutcomePanel({ reportId, findings, standing, installerNote, onAnswer, timeZone }: {
  reportId: string;
  /** The project's jurisdiction's IANA zone. */
  timeZone: string;
  findings: Finding[];
  standing: StandingOutcome | null;
  installerNote: { text: string; by: string | null } | null;
  /** True when the outcome to record is on the installer's answer to corrections. */
  onAnswer: boolean;
}) {
  const [revising, setRevising] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const done = (m: string) => {
    setMessage(m);
    setRevising(false);
  };
  const titles = new Map(findings.map((f) => [f.ruleKey, f.title]));
  const note = installerNote && (
    <p className="whitespace-pre-line text-sm"><span className="font-semibold">Installer’s note{installerNote.by ? ` (${installerNote.by})` : ''}:</span> {installerNote.text}</p>
  );

  return (
    <div className="space-y-4">
      {message && <p role="status" className="text-sm font-semibold text-status-pass">{message}</p>}
      {standing && !revising && (
        <section className="card space-y-2 p-5 text-sm" aria-labelledby="standing-h" data-testid="standing-outcome">
          <h2 id="standing-h" className="font-bold">Outcome recorded</h2>
          <p>
            {standing.outcome === 'approved' ? <StatusBadge status="pass" label={OUTCOME_LABEL.approved} /> : <StatusBadge status="fail" label={OUTCOME_LABEL['corrections-needed']} />}
          </p>
          <p className="text-ink-soft">
            {standing.inspectorName ?? 'Inspector'} · {formatDateTime(standing.createdAt, timeZone)}
          </p>
          {standing.comment && <p className="whitespace-pre-line">{standing.comment}</p>}
          {Object.entries(standing.findingComments).map(([k, c]) => (
            <p key={k}><span className="font-semibold">{titles.get(k) ?? k}:</span> {c}</p>
          ))}
          {note}
          <button type="button" className="btn-secondary" onClick={() => { setMessage(null); setRevising(true); }}>Revise outcome</button>
        </section>
      )}
      {!standing && (
        <>
          {onAnswer && (
            <div className="card space-y-2 p-5 text-sm">
              <p className="font-semibold">The installer answered the corrections with a new check: the findings shown are that check’s.</p>
              {note}
            </div>
          )}
          {!onAnswer && note && <div className="card p-5">{note}</div>}
          <ReviewForm reportId={reportId} findings={findings} onDone={done} />
        </>
      )}
      {standing && revising && (
        <ReviewForm
          reportId={reportId}
          findings={findings}
          revises={{ id: standing.id, outcome: standing.outcome, comment: standing.comment, findingComments: standing.findingComments }}
          onCancel={() => setRevising(false)}
          onDone={done}
        />
      )}
    </div>
  );
}
