/**
 * Local stand-in for a mail server: accepts any mail over SMTP on loopback, keeps it in
 * memory, and shows it over HTTP — a web inbox for people trying the demo, and a JSON API
 * (`GET /api/messages`, `DELETE /api/messages`) that integration and browser tests read.
 * `POST /api/pause` makes the SMTP port refuse connections, as a mail server that is down would,
 * until `POST /api/resume`: tests run apart from the runner, so they cannot restart this process.
 */
import http from 'node:http';
import { parseArgs } from 'node:util';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { escapeHtml as escape } from '../lib/html';

const { values } = parseArgs({
  options: {
    'smtp-port': { type: 'string', default: '2525' },
    'http-port': { type: 'string', default: '2526' },
  },
});

interface Message {
  id: number;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  messageId: string;
  headers: Record<string, string>;
  receivedAt: string;
}

const messages: Message[] = [];
let nextId = 1;

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        messages.push({
          id: nextId++,
          from: mail.from?.text ?? '',
          to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : '',
          messageId: mail.messageId ?? '',
          headers: Object.fromEntries(mail.headerLines.map((h) => [h.key, h.line.slice(h.line.indexOf(':') + 1).trim()])),
          receivedAt: new Date().toISOString(),
        });
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});

/**
 * A mail's HTML part as the receiver would see it, in a frame that runs no script and cannot reach
 * the inbox page; its links open in a new tab, so sign-in links still work from the inbox.
 */
const htmlFrame = (html: string) =>
  `<iframe title="HTML part" sandbox="allow-popups allow-popups-to-escape-sandbox" ` +
  `style="width:100%;height:22rem;border:1px solid #ccc" srcdoc="${escape(`<base target="_blank">${html}`)}"></iframe>`;

let paused = false;

const web = http.createServer((req, res) => {
  const url = new URL(req.url ?? '/', 'http://localhost');
  if (req.method === 'POST' && url.pathname === '/api/pause') {
    if (!paused) {
      paused = true;
      // Closing the listening socket only: connections already open finish their mail.
      smtp.server.close();
    }
    res.writeHead(204).end();
    return;
  }
  if (req.method === 'POST' && url.pathname === '/api/resume') {
    if (!paused) {
      res.writeHead(204).end();
      return;
    }
    paused = false;
    smtp.server.listen(Number(values['smtp-port']), '127.0.0.1', () => res.writeHead(204).end());
    return;
  }
  if (url.pathname === '/api/messages') {
    if (req.method === 'DELETE') {
      messages.length = 0;
      res.writeHead(204).end();
      return;
    }
    const to = url.searchParams.get('to')?.toLowerCase();
    const list = to ? messages.filter((m) => m.to.includes(to)) : messages;
    res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(list));
    return;
  }
  const rows = [...messages]
    .reverse()
    .map(
      (m) =>
        `<article><h2>${escape(m.subject)}</h2><p><b>To:</b> ${escape(m.to.join(', '))} · ${m.receivedAt}</p>` +
        (m.html ? htmlFrame(m.html) : '') +
        `<details${m.html ? '' : ' open'}><summary>Text part</summary>` +
        `<pre>${escape(m.text).replace(/(https?:\/\/[^\s<]+)/g, (url) => `<a href="${url}">${url}</a>`)}</pre></details></article>`,
    )
    .join('<hr>');
  res
    .writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
    .end(
      `<!doctype html><meta charset="utf-8"><title>Local inbox</title>` +
        `<body style="font-family:sans-serif;max-width:48rem;margin:2rem auto">` +
        `<h1>Local inbox (${messages.length})</h1>${rows || '<p>No mail yet.</p>'}</body>`,
    );
});

smtp.listen(Number(values['smtp-port']), '127.0.0.1', () => {
  web.listen(Number(values['http-port']), '127.0.0.1', () => {
    console.log(`smtp-fake listening on smtp://127.0.0.1:${values['smtp-port']}, inbox http://127.0.0.1:${values['http-port']}`);
  });
});

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    web.close();
    smtp.close(() => process.exit(0));
  });
}
