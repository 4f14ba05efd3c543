/**
 * A photo's thumbnail, report-size image and copy without metadata are made by a job after the upload answers.
 * Documents get none and are ready at once.
 */
export type AttachmentDerivativesStatus = 'pending' | 'making' | 'retrying' | 'ready' | 'failed';

export type AttachmentDerivatives = {
  status: AttachmentDerivativesStatus;
  attempts: number;
  maxAttempts: number;
  lastError: string | null;
};

export type DerivativesStateView = { label: string; tone: 'pending' | 'done' | 'problem'; canMakeAgain: boolean };

/** The words shown where a thumbnail will be, in the same pattern as an e-mail's delivery state. */
export function derivativesState(d: AttachmentDerivatives): DerivativesStateView {
  switch (d.status) {
    case 'ready':
      return { label: 'ready', tone: 'done', canMakeAgain: false };
    case 'pending':
      return { label: 'thumbnail queued', tone: 'pending', canMakeAgain: false };
    case 'making':
      return { label: d.attempts > 1 ? `thumbnail being made (attempt ${d.attempts})` : 'thumbnail being made', tone: 'pending', canMakeAgain: false };
    case 'retrying':
      return { label: `thumbnail failed, retrying (${d.attempts} of ${d.maxAttempts} attempts made)`, tone: 'problem', canMakeAgain: false };
    case 'failed':
      return { label: `thumbnail not made after ${d.attempts} attempt${d.attempts === 1 ? '' : 's'}`, tone: 'problem', canMakeAgain: true };
  }
}
