import { z } from 'zod';

export const NOTE_MAX_CHARS = 1000;

/** The send form and the API share this schema. */
export const sendSchema = z.strictObject({
  // RFC 5321 §4.5.3.1.3: a path is at most 256 octets, so an address at most 254 characters.
  to: z.email('Give the inspector’s e-mail address.').max(254, 'An e-mail address has at most 254 characters.').optional()
    .describe('Defaults to the jurisdiction’s inspector e-mail.'),
  note: z.string().max(NOTE_MAX_CHARS, `Keep the note to ${NOTE_MAX_CHARS.toLocaleString('en-US')} characters.`).optional(),
  confirm: z.boolean().optional().describe('Send to an address that is neither the inspector’s nor one the company used before.'),
  confirmFailingFindings: z.boolean().optional().describe('Send a report whose check has failing findings.'),
});
export type SendInput = z.infer<typeof sendSchema>;
