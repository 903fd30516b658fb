// A local SMTP catcher: accepts every message nodemailer sends over plain SMTP on loopback,
// keeps it (in memory and, when given a file, on disk), and lists it over a small JSON API.
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import http from 'node:http';
import fs from 'node:fs';
import crypto from 'node:crypto';
import type { CaughtMessage } from '../../mail/caught-message';


export interface MailCatcherOptions {
  host?: string;
  smtpPort: number;
  apiPort: number;
  /** Append-only JSON lines file; messages survive a restart. */
  dataFile?: string;
}

export interface MailCatcher {
  smtpPort: number;
  apiPort: number;
  messages(): CaughtMessage[];
  clear(): void;
  close(): Promise<void>;
}

function loadMessages(file?: string): CaughtMessage[] {
  if (!file || !fs.existsSync(file)) return [];
  return fs
    .readFileSync(file, 'utf8')
    .split('\n')
    .filter(Boolean)
    .map((line) => JSON.parse(line) as CaughtMessage);
}

export async function startMailCatcher({ host = '127.0.0.1', smtpPort, apiPort, dataFile }: MailCatcherOptions): Promise<MailCatcher> {
  let messages = loadMessages(dataFile);

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const message: CaughtMessage = {
            id: crypto.randomUUID(),
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? String(session.envelope.mailFrom && session.envelope.mailFrom.address),
            to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
          };
          messages.push(message);
          if (dataFile) fs.appendFileSync(dataFile, JSON.stringify(message) + '\n');
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });

  const api = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', `http://${host}`);
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { 'content-type': 'application/json' });
      res.end(JSON.stringify(body));
    };
    if (req.method === 'GET' && url.pathname === '/messages') {
      const to = url.searchParams.get('to')?.toLowerCase();
      const list = to ? messages.filter((m) => m.to.includes(to)) : messages;
      return send(200, [...list].reverse());
    }
    const one = url.pathname.match(/^\/messages\/([\w-]+)$/);
    if (req.method === 'GET' && one) {
      const found = messages.find((m) => m.id === one[1]);
      return found ? send(200, found) : send(404, { error: 'not found' });
    }
    if (req.method === 'DELETE' && url.pathname === '/messages') {
      messages = [];
      if (dataFile) fs.writeFileSync(dataFile, '');
      return send(200, { cleared: true });
    }
    if (req.method === 'GET' && url.pathname === '/health') return send(200, { status: 'ok' });
    send(404, { error: 'not found' });
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(smtpPort, host, () => resolve());
  });
  await new Promise<void>((resolve, reject) => {
    api.once('error', reject);
    api.listen(apiPort, host, () => resolve());
  });

  return {
    smtpPort,
    apiPort,
    messages: () => messages,
    clear: () => {
      messages = [];
    },
    close: async () => {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      await new Promise<void>((resolve) => api.close(() => resolve()));
    },
  };
}
