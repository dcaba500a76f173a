/**
 * A small MIME reader for the development mail fake: enough for what nodemailer sends
 * (RFC 5322 headers with RFC 2047 encoded words, nested multipart, quoted-printable, base64,
 * 7bit/8bit bodies). It is not a general mail parser: a message it cannot read still shows
 * in the inbox by its raw text.
 *
 * Parsing works on a "binary string" (one char per byte, `latin1`) so that 8bit bodies and
 * multi-byte characters split across encoded words keep their bytes until the charset is known.
 */

/** Headers with lower-cased names; a repeated header keeps its first value. */
export type MimeHeaders = Map<string, string>;

/** What the inbox needs from a message. */
export interface ReadMessage {
  headers: MimeHeaders;
  /** The decoded Subject, '' when absent. */
  subject: string;
  /** The first text/plain part that is not an attachment, line ends as `\n`; '' when absent. */
  text: string;
  /** The first text/html part that is not an attachment, or null. */
  html: string | null;
}

/** Reads a whole message as received over SMTP. */
export function readMessage(raw: Buffer): ReadMessage {
  const found: { text?: string; html?: string } = {};
  const headers = walk(raw.toString('latin1'), found);
  return {
    headers,
    subject: decodeHeaderValue(headers.get('subject') ?? ''),
    text: found.text ?? '',
    html: found.html ?? null,
  };
}

/** Reads one entity's headers and collects its text parts; recursion follows multiparts. */
function walk(entity: string, found: { text?: string; html?: string }, depth = 0): MimeHeaders {
  const { headers, body } = splitEntity(entity);
  const { type, params } = parseContentType(headers.get('content-type') ?? 'text/plain');
  const attachment = /^\s*attachment/i.test(headers.get('content-disposition') ?? '');
  // A depth limit keeps a hostile or broken message from recursing without end.
  if (type.startsWith('multipart/') && params.boundary && depth < 10) {
    for (const part of splitMultipart(body, params.boundary)) walk(part, found, depth + 1);
  } else if (!attachment && (type === 'text/plain' || type === 'text/html')) {
    const bytes = decodeTransfer(body, headers.get('content-transfer-encoding') ?? '7bit');
    const content = decodeBytes(bytes, params.charset ?? 'utf-8');
    if (type === 'text/plain' && found.text === undefined) found.text = content.replace(/\r\n/g, '\n');
    if (type === 'text/html' && found.html === undefined) found.html = content;
  }
  return headers;
}

/** Splits at the first empty line and unfolds the header lines (RFC 5322 §2.2.3). */
function splitEntity(entity: string): { headers: MimeHeaders; body: string } {
  const match = /\r?\n\r?\n/.exec(entity);
  const head = match ? entity.slice(0, match.index) : entity;
  const body = match ? entity.slice(match.index + match[0].length) : '';
  const headers: MimeHeaders = new Map();
  for (const line of head.replace(/\r?\n(?=[ \t])/g, '').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    // Raw 8-bit header bytes (SMTPUTF8) are UTF-8; encoded words are decoded later.
    if (!headers.has(name)) headers.set(name, decodeBytes(toBytes(line.slice(colon + 1).trim()), 'utf-8'));
  }
  return { headers, body };
}

/** `type/subtype; name=value; name="quoted value"` → lower-cased type and parameters. */
export function parseContentType(value: string): { type: string; params: Record<string, string> } {
  const [type, ...rest] = value.split(';');
  const params: Record<string, string> = {};
  for (const param of rest) {
    const eq = param.indexOf('=');
    if (eq < 0) continue;
    const name = param.slice(0, eq).trim().toLowerCase();
    params[name] = param.slice(eq + 1).trim().replace(/^"(.*)"$/s, '$1').replace(/\\(.)/g, '$1');
  }
  return { type: type.trim().toLowerCase(), params };
}

/** The body parts between `--boundary` delimiter lines, without preamble and epilogue. */
function splitMultipart(body: string, boundary: string): string[] {
  const delimiter = new RegExp(`(?:^|\\r?\\n)--${escapeRegExp(boundary)}(--)?[ \\t]*(?=\\r?\\n|$)`, 'g');
  const parts: string[] = [];
  let start = -1;
  for (let m = delimiter.exec(body); m; m = delimiter.exec(body)) {
    if (start >= 0) parts.push(body.slice(start, m.index).replace(/^\r?\n/, ''));
    if (m[1]) break; // the closing delimiter
    start = m.index + m[0].length;
  }
  return parts;
}

/** Undoes the Content-Transfer-Encoding; unknown encodings pass through unchanged. */
function decodeTransfer(body: string, encoding: string): Uint8Array {
  switch (encoding.trim().toLowerCase()) {
    case 'base64':
      return Buffer.from(body.replace(/[^A-Za-z0-9+/=]/g, ''), 'base64');
    case 'quoted-printable':
      return decodeQuotedPrintable(body.replace(/[ \t]+(?=\r?\n)/g, '').replace(/=\r?\n/g, ''));
    default:
      return toBytes(body);
  }
}

function decodeQuotedPrintable(text: string): Uint8Array {
  return toBytes(text.replace(/=([0-9A-Fa-f]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16))));
}

/**
 * Decodes RFC 2047 encoded words (`=?utf-8?B?…?=`, `=?utf-8?Q?…?=`). Adjacent words are joined
 * before decoding because an encoder may split one multi-byte character across two words.
 */
export function decodeHeaderValue(value: string): string {
  const word = /=\?([^?\s]+)\?([BbQq])\?([^?\s]*)\?=/g;
  const pieces: ({ text: string } | { charset: string; bytes: number[] })[] = [];
  let last = 0;
  for (let m = word.exec(value); m; m = word.exec(value)) {
    const between = value.slice(last, m.index);
    const previous = pieces.at(-1);
    // Whitespace between two encoded words is not part of the text (RFC 2047 §6.2).
    const joined = previous !== undefined && 'bytes' in previous && /^[ \t\r\n]*$/.test(between);
    if (!joined && between) pieces.push({ text: between });
    const charset = m[1].split('*')[0].toLowerCase(); // drop an RFC 2231 language tag
    const bytes = m[2].toUpperCase() === 'B' ? Buffer.from(m[3], 'base64') : decodeQuotedPrintable(m[3].replace(/_/g, ' '));
    const tail = pieces.at(-1);
    if (joined && tail && 'bytes' in tail && tail.charset === charset) tail.bytes.push(...bytes);
    else pieces.push({ charset, bytes: [...bytes] });
    last = m.index + m[0].length;
  }
  pieces.push({ text: value.slice(last) });
  return pieces.map((p) => ('text' in p ? p.text : decodeBytes(Uint8Array.from(p.bytes), p.charset))).join('');
}

function decodeBytes(bytes: Uint8Array, charset: string): string {
  try {
    return new TextDecoder(charset).decode(bytes);
  } catch {
    // An unknown charset label: UTF-8 is the best guess for mail sent by our own server.
    return new TextDecoder('utf-8').decode(bytes);
  }
}

function toBytes(binary: string): Uint8Array {
  return Buffer.from(binary, 'latin1');
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
