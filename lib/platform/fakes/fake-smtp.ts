// A local stand-in for a mail relay: accepts SMTP on loopback, keeps every message as an .eml file,
// and serves an inbox page and a JSON API so the demo and the tests can read what was sent.
import { promises as fs } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export type FakeSmtpOptions = { smtpPort: number; httpPort: number; dir: string; host?: string };

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

async function listMessages(dir: string) {
  const files = (await fs.readdir(dir).catch(() => [])).filter((f) => f.endsWith('.eml')).sort().reverse();
  const out = [];
  for (const file of files) {
    const parsed = await simpleParser(await fs.readFile(path.join(dir, file)));
    out.push({
      id: file.replace(/\.eml$/, ''),
      from: parsed.from?.text ?? '',
      to: Array.isArray(parsed.to) ? parsed.to.map((t) => t.text).join(', ') : (parsed.to?.text ?? ''),
      replyTo: parsed.replyTo?.text ?? '',
      subject: parsed.subject ?? '',
      date: parsed.date?.toISOString() ?? null,
      text: parsed.text ?? '',
      attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? null, contentType: a.contentType, size: a.size })),
    });
  }
  return out;
}

export async function startFakeSmtp(opts: FakeSmtpOptions): Promise<{ close: () => Promise<void> }> {
  const host = opts.host ?? '127.0.0.1';
  await fs.mkdir(opts.dir, { recursive: true });
  let seq = 0;
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: 25 * 1024 * 1024,
    logger: false,
    // Addresses at .invalid domains (RFC 2606) are refused, so tests can see a relay say no.
    onRcptTo(address, _session, callback) {
      if (/\.invalid$/i.test(address.address)) {
        const err = new Error(`Mailbox unavailable: ${address.address}`) as Error & { responseCode: number };
        err.responseCode = 550;
        return callback(err);
      }
      callback();
    },
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', async () => {
        const name = `${Date.now().toString().padStart(15, '0')}-${String(seq++).padStart(4, '0')}.eml`;
        try {
          await fs.writeFile(path.join(opts.dir, name), Buffer.concat(chunks));
          callback();
        } catch (err) {
          callback(err as Error);
        }
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(opts.smtpPort, host, () => resolve());
  });

  const web = http.createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? '/', `http://${host}`);
      if (url.pathname === '/api/messages' && req.method === 'DELETE') {
        for (const f of await fs.readdir(opts.dir)) if (f.endsWith('.eml')) await fs.unlink(path.join(opts.dir, f));
        res.writeHead(204).end();
        return;
      }
      const messages = await listMessages(opts.dir);
      if (url.pathname === '/api/messages') {
        res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(messages));
        return;
      }
      if (url.pathname.startsWith('/raw/')) {
        const id = path.basename(url.pathname.slice(5));
        const raw = await fs.readFile(path.join(opts.dir, `${id}.eml`)).catch(() => null);
        if (!raw) return void res.writeHead(404).end('no such message');
        res.writeHead(200, { 'content-type': 'message/rfc822' }).end(raw);
        return;
      }
      const rows = messages
        .map(
          (m) => `<article><h2>${esc(m.subject)}</h2><p class="meta">${esc(m.date ?? '')} · from ${esc(m.from)} · to ${esc(m.to)}</p>
<pre>${esc(m.text)}</pre>${m.attachments.length ? `<p class="meta">Attachments: ${m.attachments.map((a) => `${esc(a.filename ?? 'unnamed')} (${esc(a.contentType)}, ${a.size} bytes)`).join(', ')}</p>` : ''}
<p><a href="/raw/${esc(m.id)}">raw message</a></p></article>`,
        )
        .join('\n');
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(`<!doctype html><meta charset="utf-8"><title>Local test inbox</title>
<style>body{font:15px/1.5 system-ui,sans-serif;max-width:52rem;margin:2rem auto;padding:0 1rem;color:#1c2a3a;background:#f6f4ee}article{background:#fff;border:1px solid #d6d0c2;border-radius:8px;padding:1rem;margin:1rem 0}.meta{color:#6b7785;font-size:13px}pre{white-space:pre-wrap}</style>
<h1>Local test inbox</h1><p class="meta">Messages NookPass sent through the local fake mail server. Nothing here left this machine.</p>
${rows || '<p>No messages yet.</p>'}`);
    } catch (err) {
      res.writeHead(500).end(String(err));
    }
  });
  await new Promise<void>((resolve, reject) => {
    web.once('error', reject);
    web.listen(opts.httpPort, host, () => resolve());
  });

  return {
    close: () =>
      new Promise<void>((resolve) => {
        web.close();
        smtp.close(() => resolve());
      }),
  };
}

if (process.argv[1] && /fake-smtp\.ts$/.test(process.argv[1])) {
  const smtpPort = Number(process.env.NOOKPASS_SMTP_PORT ?? 54325);
  const httpPort = Number(process.env.NOOKPASS_INBOX_PORT ?? 54326);
  const dir = process.env.NOOKPASS_MAIL_DIR ?? path.join(process.cwd(), '.data', 'mail');
  startFakeSmtp({ smtpPort, httpPort, dir })
    .then(() => console.log(`[fake-smtp] SMTP on 127.0.0.1:${smtpPort}, inbox at http://127.0.0.1:${httpPort}`))
    .catch((err) => {
      console.error('[fake-smtp]', err.message);
      process.exit(1);
    });
}
