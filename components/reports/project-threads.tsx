import { AnswerForm } from '@/components/reports/answer-form';
import { ThreadSection, type ThreadSectionEntry } from '@/components/reports/thread-section';
import type { ThreadState } from '@/lib/domain/reports/thread';

type ProjectThread = {
  rootReport: { id: string; code: string };
  state: ThreadState;
  entries: ThreadSectionEntry[];
  underReview: { id: string; createdAt: Date };
  findingTitles: Record<string, string>;
  reportedCheckId: string;
};

const STATE_TEXT: Record<ThreadState['kind'], string> = {
  'awaiting-outcome': 'Waiting for the inspector’s outcome.',
  'awaiting-corrections': 'The inspector asked for corrections.',
  approved: 'Approved by the inspector.',
};

/** The project's inspection threads, one per report that reached the inspector, with the answer form where corrections wait. */
export function ProjectThreads({ projectId, threads, latestCheck, canAnswer, timeZone }: {
  projectId: string;
  /** The project's jurisdiction's IANA zone. */
  timeZone: string;
  threads: ProjectThread[];
  latestCheck: { id: string; createdAt: Date; counts: string } | null;
  canAnswer: boolean;
}) {
  return (
    <section className="space-y-4" aria-labelledby="outcome-h" data-testid="inspection-outcomes">
      <h2 id="outcome-h" className="text-lg font-bold">Inspection outcomes</h2>
      {threads.map((t) => (
        <div key={t.rootReport.id} data-report={t.rootReport.code}>
          <ThreadSection
            entries={t.entries}
            findingTitles={t.findingTitles}
            findingLinks={{ projectId, reportedCheckId: t.reportedCheckId }}
            headingId={`thread-${t.rootReport.code}`}
            heading={`Report ${t.rootReport.code}: ${STATE_TEXT[t.state.kind]}`}
            timeZone={timeZone}
          />
          {canAnswer && (
            // Kept mounted while the thread waits for the outcome, so the answer's confirmation outlives the refresh
            // that removes the form; a new outcome (a new review) starts a fresh form.
            <AnswerForm
              key={t.underReview.id}
              open={t.state.kind === 'awaiting-corrections'}
              projectId={projectId}
              reportCode={t.rootReport.code}
              reviewedAt={t.underReview.createdAt.toISOString()}
              latestCheck={latestCheck && { id: latestCheck.id, createdAt: latestCheck.createdAt.toISOString(), counts: latestCheck.counts }}
              timeZone={timeZone}
            />
          )}
        </div>
      ))}
    </section>
  );
}
