/**
 * The development mail fake: a local SMTP server that keeps every message it receives in
 * memory, and a small web inbox to read them. The team server sends its invitations and
 * share notices here during development and in tests, over real SMTP, so the same mail code
 * runs as against a real relay.
 *
 * - SMTP without authentication or STARTTLS (senders need `ignoreTLS: true`), 5 MB per message;
 * - HTTP: `GET /` the inbox, `GET /messages/<id>` one message, and for scripts and tests
 *   `GET /api/messages[?to=address]` → `{ items }` newest first, `GET /api/messages/<id>`,
 *   `DELETE /api/messages`;
 * - both listen on loopback only: the fake accepts mail from anyone who can reach it.
 */
import { randomUUID } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo, Server as NetServer } from 'node:net';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { decodeHeaderValue, readMessage } from './mime';

/** One received message, decoded for reading. */
export interface MailMessage {
  id: string;
  /** The decoded From header (as a reader sees it), else the envelope sender. */
  from: string;
  /** The envelope recipients: everyone the message was delivered to, Bcc included. */
  to: string[];
  subject: string;
  /** The text/plain part with `\n` line ends; '' when the message has none. */
  text: string;
  /** The text/html part, or null. */
  html: string | null;
  /** When the fake received it, ISO 8601. */
  receivedAt: string;
  /** The whole message as received (UTF-8). */
  raw: string;
}

/** A started mail fake. */
export interface RunningMailFake {
  /** The SMTP port actually listened on (the real one when 0 was asked for). */
  smtpPort: number;
  host: string;
  /** The inbox page, e.g. `http://127.0.0.1:PORT/`. */
  inboxUrl: string;
  /** Kept messages, oldest first. */
  messages(): MailMessage[];
  clear(): void;
  /** Stops both servers; open connections are cut rather than waited for. */
  close(): Promise<void>;
}

/** Options of {@link startMailFake}; a port of 0 picks a free one. */
export interface MailFakeOptions {
  smtpPort: number;
  httpPort: number;
  /** A loopback address; default 127.0.0.1. */
  host?: string;
}

const MAX_SIZE = 5 * 1024 * 1024;
// A development fake keeps mail in memory: the cap bounds it during long sessions.
const MAX_KEPT = 500;

/** Starts the SMTP server and the inbox; resolves once both listen. */
export async function startMailFake(o: MailFakeOptions): Promise<RunningMailFake> {
  const host = o.host ?? '127.0.0.1';
  if (!isLoopback(host)) throw new Error(`The mail fake listens on loopback only, not on ${host}.`);
  const kept: MailMessage[] = [];

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_SIZE,
    rejectOversized: true,
    disableReverseLookup: true, // a DNS lookup per connection only slows local tests down
    logger: false,
    banner: 'Nodewright development mail fake',
    closeTimeout: 200,
    onData(stream, session, callback) {
      receive(stream, session)
        .then((message) => {
          // rejectOversized already answers 552; the message must not be kept either.
          if (stream.sizeExceeded) return callback(Object.assign(new Error('Message exceeds 5 MB'), { responseCode: 552 }));
          kept.push(message);
          if (kept.length > MAX_KEPT) kept.splice(0, kept.length - MAX_KEPT);
          callback(null, `Kept as ${message.id}`);
        })
        .catch((error: Error) => callback(error));
    },
  });
  // Without a listener an 'error' event would crash the process; a client error is not fatal.
  smtp.on('error', (error: Error) => console.warn(`mail fake: ${error.message}`));
  const smtpPort = await listen(smtp.server, o.smtpPort, host);

  const http = createServer((req, res) => {
    try {
      route(req, res, kept);
    } catch (error) {
      res.writeHead(500, { 'content-type': 'text/plain; charset=utf-8' }).end(String(error));
    }
  });
  const httpPort = await listen(http, o.httpPort, host).catch(async (error: unknown) => {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw error;
  });

  const urlHost = host.includes(':') ? `[${host}]` : host;
  return {
    smtpPort,
    host,
    inboxUrl: `http://${urlHost}:${httpPort}/`,
    messages: () => kept.slice(),
    clear: () => void kept.splice(0),
    async close() {
      http.closeAllConnections();
      await Promise.all([
        new Promise<void>((resolve) => http.close(() => resolve())),
        new Promise<void>((resolve) => smtp.close(() => resolve())),
      ]);
    },
  };
}

async function receive(stream: SMTPServerDataStream, session: SMTPServerSession): Promise<MailMessage> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  const raw = Buffer.concat(chunks);
  const read = readMessage(raw);
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
  return {
    id: randomUUID(),
    from: decodeHeaderValue(read.headers.get('from') ?? '') || envelopeFrom,
    to: session.envelope.rcptTo.map((r) => r.address),
    subject: read.subject,
    text: read.text,
    html: read.html,
    receivedAt: new Date().toISOString(),
    raw: raw.toString('utf8'),
  };
}

function route(req: IncomingMessage, res: ServerResponse, kept: MailMessage[]): void {
  const url = new URL(req.url ?? '/', 'http://inbox');
  const method = req.method ?? 'GET';
  const newestFirst = () => kept.slice().reverse();
  const byId = (id: string) => kept.find((m) => m.id === decodeURIComponent(id));

  if (url.pathname === '/api/messages') {
    if (method === 'DELETE') {
      kept.splice(0);
      return void res.writeHead(204).end();
    }
    if (method !== 'GET') return methodNotAllowed(res, 'GET, DELETE');
    const to = url.searchParams.get('to')?.trim().toLowerCase();
    const items = newestFirst().filter((m) => !to || m.to.some((a) => a.toLowerCase() === to));
    return json(res, 200, { items });
  }
  if (method !== 'GET' && method !== 'HEAD') return methodNotAllowed(res, 'GET');
  const api = /^\/api\/messages\/([^/]+)$/.exec(url.pathname);
  if (api) {
    const message = byId(api[1]);
    return message ? json(res, 200, message) : json(res, 404, { error: { code: 'not_found', message: 'No such message.' } });
  }
  if (url.pathname === '/') return html(res, 200, inboxPage(newestFirst()));
  const page = /^\/messages\/([^/]+)$/.exec(url.pathname);
  const message = page && byId(page[1]);
  if (message) return html(res, 200, messagePage(message));
  return html(res, 404, layout('Not found', '<p>No such page or message. <a href="/">Back to the inbox</a>.</p>'));
}

function inboxPage(items: MailMessage[]): string {
  const rows = items
    .map(
      (m) =>
        `<tr><td><time datetime="${esc(m.receivedAt)}">${esc(shortTime(m.receivedAt))}</time></td>` +
        `<td>${esc(m.to.join(', '))}</td>` +
        `<td><a href="/messages/${encodeURIComponent(m.id)}">${esc(m.subject || '(no subject)')}</a></td></tr>`,
    )
    .join('\n');
  const body = items.length
    ? `<table><thead><tr><th>Received</th><th>To</th><th>Subject</th></tr></thead><tbody>\n${rows}\n</tbody></table>`
    : '<p>No mail yet. Messages the team server sends during development appear here.</p>';
  return layout('Development inbox', `<h1>Development inbox</h1>\n<p class="note">Mail kept by the local mail fake, newest first (at most ${MAX_KEPT}, until it stops).</p>\n${body}`);
}

function messagePage(m: MailMessage): string {
  // The HTML part is shown sandboxed: no scripts, and its links open in the whole tab.
  const frame = m.html === null
    ? ''
    : `<h2>HTML part</h2>\n<iframe title="HTML part" sandbox="allow-popups allow-popups-to-escape-sandbox allow-top-navigation-by-user-activation" srcdoc="${esc('<base target="_top">' + m.html)}"></iframe>`;
  return layout(
    m.subject || '(no subject)',
    `<p><a href="/">← Inbox</a></p>
<h1>${esc(m.subject || '(no subject)')}</h1>
<dl><dt>From</dt><dd>${esc(m.from)}</dd><dt>To</dt><dd>${esc(m.to.join(', '))}</dd><dt>Received</dt><dd>${esc(m.receivedAt)}</dd></dl>
<h2>Text part</h2>
<pre>${linkify(m.text) || '(none)'}</pre>
${frame}`,
  );
}

/** Escapes the text and turns its web addresses into links, so a link in a mail can be followed. */
function linkify(text: string): string {
  // With a capturing group, split() keeps the addresses at the odd indices.
  return text
    .split(/(https?:\/\/[^\s<>"']+)/)
    .map((piece, i) => (i % 2 ? `<a href="${esc(piece)}">${esc(piece)}</a>` : esc(piece)))
    .join('');
}

function layout(title: string, main: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)} · Nodewright mail</title>
<style>
body { font: 16px/1.5 system-ui, sans-serif; color: #1d232b; background: #fff; margin: 2rem auto; max-width: 60rem; padding: 0 1rem; }
a { color: #0b57a4; } .note { color: #4a5561; }
table { border-collapse: collapse; width: 100%; } th, td { text-align: left; padding: .4rem .6rem; border-bottom: 1px solid #dde2e8; vertical-align: top; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: .2rem 1rem; } dt { color: #4a5561; } dd { margin: 0; }
pre { white-space: pre-wrap; background: #f5f7f9; padding: 1rem; border-radius: 4px; }
iframe { width: 100%; height: 28rem; border: 1px solid #dde2e8; border-radius: 4px; background: #fff; }
</style></head>
<body>
${main}
</body></html>`;
}

function html(res: ServerResponse, status: number, page: string): void {
  res.writeHead(status, {
    'content-type': 'text/html; charset=utf-8',
    // Mail may reference remote images or scripts: nothing is fetched from anywhere.
    'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; img-src data:; frame-src 'self'; form-action 'none'",
    'x-content-type-options': 'nosniff',
    'cache-control': 'no-store',
  });
  res.end(page);
}

function json(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
  res.end(JSON.stringify(body));
}

function methodNotAllowed(res: ServerResponse, allow: string): void {
  res.setHeader('allow', allow);
  json(res, 405, { error: { code: 'method_not_allowed', message: `Use ${allow}.` } });
}

function shortTime(iso: string): string {
  return iso.replace('T', ' ').slice(0, 19);
}

/** Escapes text for HTML content and double-quoted attributes. */
function esc(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function isLoopback(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127\.\d+\.\d+\.\d+$/.test(host);
}

function listen(server: NetServer, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve((server.address() as AddressInfo).port);
    });
  });
}
