import { derivativesState, type AttachmentDerivatives } from '@/lib/domain/attachments/derivatives';

/**
 * Where a photo's thumbnail will be while the job has not made it: the state in words (queued, being made,
 * retrying, not made), in the same terms as an e-mail's delivery. No `'use client'`: server pages use it too.
 */
export function ThumbnailState({ derivatives, filename }: { derivatives: AttachmentDerivatives; filename: string }) {
  const state = derivativesState(derivatives);
  const tone = state.tone === 'problem' ? 'text-status-fail' : 'text-ink-soft';
  return (
    <div
      className="flex aspect-[4/3] w-full flex-col items-center justify-center gap-1 rounded border border-dashed border-rule bg-paper-deep p-3 text-center text-xs"
      data-testid="thumbnail-state"
      data-derivatives-status={derivatives.status}
    >
      <span className="font-mono text-ink-soft">{filename}</span>
      <span className={`font-semibold ${tone}`} role="status">
        Photo: {state.label}
      </span>
      {derivatives.lastError && derivatives.status !== 'ready' && <span className="text-ink-soft">({derivatives.lastError})</span>}
    </div>
  );
}
