import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { ServiceUnavailableError, ValidationError } from '@/lib/domain/errors';
import { log } from '@/lib/platform/log';

export function mailConfig() {
  return {
    host: process.env.NOOKPASS_SMTP_HOST ?? '127.0.0.1',
    port: Number(process.env.NOOKPASS_SMTP_PORT ?? 54325),
    secure: process.env.NOOKPASS_SMTP_SECURE === '1',
    user: process.env.NOOKPASS_SMTP_USER,
    pass: process.env.NOOKPASS_SMTP_PASS,
    from: process.env.NOOKPASS_MAIL_FROM ?? 'NookPass <reports@nookpass.demo>',
  };
}

const g = globalThis as unknown as { nookpassMail?: Transporter };

function transport(): Transporter {
  if (!g.nookpassMail) {
    const c = mailConfig();
    g.nookpassMail = nodemailer.createTransport({
      host: c.host,
      port: c.port,
      secure: c.secure,
      auth: c.user ? { user: c.user, pass: c.pass } : undefined,
      connectionTimeout: 5_000,
      greetingTimeout: 5_000,
      socketTimeout: 15_000,
    });
  }
  return g.nookpassMail;
}

export type OutgoingMail = {
  to: string;
  /** Where the recipient's reply goes (RFC 5322 §3.6.2), e.g. the installer who sent a report. */
  replyTo?: string | { name: string; address: string };
  subject: string;
  text: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
};

/** Sends one message; a relay that is down becomes a clear 503, never a half-done request. */
export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string }> {
  try {
    const info = await transport().sendMail({ from: mailConfig().from, ...mail });
    return { messageId: info.messageId };
  } catch (err) {
    const e = err as Error & { responseCode?: number; response?: string; code?: string };
    log.error({ err: e, code: e.code, responseCode: e.responseCode }, 'mail not sent');
    // A relay that answered and refused the address is a problem with the address, not an outage.
    if (e.responseCode && e.responseCode >= 500 && e.code === 'EENVELOPE') {
      throw new ValidationError([{ path: 'to', message: `The mail server refused ${mail.to}: ${e.response ?? e.message}` }]);
    }
    throw new ServiceUnavailableError('The mail server is not reachable right now; the message was not sent. Try again in a moment.');
  }
}
