import * as http from 'node:http';
import { type AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** A mail captured by the development SMTP catch-all. */
export interface CapturedMail {
  id: number;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  receivedAt: string;
}

export interface MailCatcher {
  smtpPort: number;
  httpPort: number | null;
  messages: CapturedMail[];
  stop(): Promise<void>;
}

const esc = (s: string): string =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c,
  );

/**
 * Stands in for the mail service in development and tests: accepts every message on loopback SMTP
 * (smtp-server), keeps it in memory, and shows it over HTTP (`/` as a page, `/messages` as JSON).
 */
export async function startMailCatcher(opts: {
  smtpPort: number;
  httpPort?: number | null;
}): Promise<MailCatcher> {
  const messages: CapturedMail[] = [];
  let nextId = 1;
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          messages.push({
            id: nextId++,
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            receivedAt: new Date().toISOString(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(opts.smtpPort, '127.0.0.1', () => resolve());
  });
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  let view: http.Server | null = null;
  if (opts.httpPort != null) {
    view = http.createServer((req, res) => {
      if (req.url === '/messages' && req.method === 'GET') {
        res.writeHead(200, { 'content-type': 'application/json' });
        res.end(JSON.stringify(messages));
      } else if (req.url === '/messages' && req.method === 'DELETE') {
        messages.length = 0;
        res.writeHead(204).end();
      } else if (req.url === '/' && req.method === 'GET') {
        res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
        const rows = [...messages]
          .reverse()
          .map(
            (m) =>
              `<article><h2>${esc(m.subject)}</h2><p><b>To:</b> ${esc(m.to.join(', '))} · ${esc(m.receivedAt)}</p><pre>${esc(m.text)}</pre></article>`,
          )
          .join('<hr>');
        res.end(
          `<!doctype html><meta charset="utf-8"><title>Kerfwright — captured mail</title><body style="font-family:sans-serif;max-width:60rem;margin:auto"><h1>Captured mail (${messages.length})</h1><p>Development only: nothing here left this machine.</p>${rows}</body>`,
        );
      } else {
        res.writeHead(404).end();
      }
    });
    await new Promise<void>((resolve) => view!.listen(opts.httpPort!, '127.0.0.1', () => resolve()));
  }
  const httpPort = view ? (view.address() as AddressInfo).port : null;
  return {
    smtpPort,
    httpPort,
    messages,
    async stop() {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      if (view) await new Promise<void>((resolve) => view!.close(() => resolve()));
    },
  };
}
