/**
 * A small reader of Internet messages (RFC 5322 headers, MIME multipart bodies, quoted-printable and
 * base64 transfer encodings, RFC 2047 encoded words), enough to show what the local fake mail server
 * received: the subject and the plain-text and HTML bodies. Attachments are ignored.
 */

export interface ReadMessage {
  subject: string;
  /** The To header, decoded. */
  to: string;
  text: string;
  html: string | null;
}

interface Part {
  headers: Map<string, string>;
  body: Buffer;
}

interface ContentType {
  type: string;
  params: Map<string, string>;
}

function splitHeaderBlock(raw: Buffer): Part {
  const text = raw.toString('latin1');
  const crlf = text.indexOf('\r\n\r\n');
  const lf = text.indexOf('\n\n');
  let end: number;
  let skip: number;
  if (crlf >= 0 && (lf < 0 || crlf < lf)) [end, skip] = [crlf, 4];
  else if (lf >= 0) [end, skip] = [lf, 2];
  else [end, skip] = [text.length, 0];
  const headers = new Map<string, string>();
  const unfolded = text.slice(0, end).replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    // Raw 8-bit header bytes (SMTPUTF8) are read as UTF-8; plain ASCII is unchanged by this.
    if (!headers.has(name))
      headers.set(name, Buffer.from(line.slice(colon + 1).trim(), 'latin1').toString('utf8'));
  }
  return { headers, body: raw.subarray(Math.min(raw.length, end + skip)) };
}

function parseContentType(value: string | undefined): ContentType {
  const [first, ...rest] = (value ?? 'text/plain').split(';');
  const params = new Map<string, string>();
  for (const p of rest) {
    const eq = p.indexOf('=');
    if (eq < 0) continue;
    let v = p.slice(eq + 1).trim();
    if (v.startsWith('"') && v.endsWith('"')) v = v.slice(1, -1).replace(/\\(.)/g, '$1');
    params.set(p.slice(0, eq).trim().toLowerCase(), v);
  }
  return { type: first.trim().toLowerCase() || 'text/plain', params };
}

function decodeCharset(bytes: Buffer, charset: string | undefined): string {
  try {
    return new TextDecoder(charset || 'utf-8').decode(bytes);
  } catch {
    return new TextDecoder('utf-8').decode(bytes);
  }
}

/** Quoted-printable to bytes (RFC 2045 §6.7): soft line breaks removed, `=XX` decoded. */
export function decodeQuotedPrintable(text: string): Buffer {
  const joined = text.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < joined.length; i++) {
    const c = joined[i];
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(joined.slice(i + 1, i + 3))) {
      bytes.push(parseInt(joined.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(joined.charCodeAt(i) & 0xff);
  }
  return Buffer.from(bytes);
}

function decodeTransfer(body: Buffer, encoding: string | undefined): Buffer {
  switch ((encoding ?? '').trim().toLowerCase()) {
    case 'base64':
      return Buffer.from(body.toString('latin1').replace(/[^A-Za-z0-9+/=]/g, ''), 'base64');
    case 'quoted-printable':
      return decodeQuotedPrintable(body.toString('latin1'));
    default:
      return body;
  }
}

/** RFC 2047 encoded words (`=?utf-8?Q?...?=`, `=?utf-8?B?...?=`); whitespace between two words goes. */
export function decodeEncodedWords(value: string): string {
  const word = /=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g;
  return value
    .replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?[^?]+\?[BbQq]\?[^?]*\?=)/g, '$1')
    .replace(word, (_m, charset: string, enc: string, data: string) => {
      const bytes =
        enc.toUpperCase() === 'B'
          ? Buffer.from(data, 'base64')
          : decodeQuotedPrintable(data.replace(/_/g, ' '));
      return decodeCharset(bytes, charset.split('*')[0]);
    });
}

function splitMultipart(body: Buffer, boundary: string): Buffer[] {
  const text = body.toString('latin1');
  const delimiter = `--${boundary}`;
  const parts: Buffer[] = [];
  let pos = text.indexOf(delimiter);
  while (pos >= 0) {
    const after = pos + delimiter.length;
    if (text.startsWith('--', after)) break; // the closing delimiter
    const start = text.indexOf('\n', after);
    if (start < 0) break;
    const next = text.indexOf(`\n${delimiter}`, start);
    const stop = next < 0 ? text.length : next;
    // The line break before the next delimiter belongs to the delimiter.
    const end = stop > start && text[stop - 1] === '\r' ? stop - 1 : stop;
    parts.push(body.subarray(start + 1, end));
    pos = next < 0 ? -1 : next + 1;
  }
  return parts;
}

function collectBodies(part: Part, out: { text: string | null; html: string | null }, depth = 0): void {
  const ct = parseContentType(part.headers.get('content-type'));
  if (ct.type.startsWith('multipart/')) {
    const boundary = ct.params.get('boundary');
    if (!boundary || depth > 8) return;
    for (const raw of splitMultipart(part.body, boundary))
      collectBodies(splitHeaderBlock(raw), out, depth + 1);
    return;
  }
  if ((part.headers.get('content-disposition') ?? '').toLowerCase().startsWith('attachment')) return;
  const decoded = () =>
    decodeCharset(
      decodeTransfer(part.body, part.headers.get('content-transfer-encoding')),
      ct.params.get('charset'),
    );
  if (ct.type === 'text/plain' && out.text === null) out.text = decoded();
  else if (ct.type === 'text/html' && out.html === null) out.html = decoded();
}

/** Read a raw message as received over SMTP. */
export function readMessage(raw: Buffer): ReadMessage {
  const top = splitHeaderBlock(raw);
  const bodies: { text: string | null; html: string | null } = { text: null, html: null };
  collectBodies(top, bodies);
  return {
    subject: decodeEncodedWords(top.headers.get('subject') ?? ''),
    to: decodeEncodedWords(top.headers.get('to') ?? ''),
    text: (bodies.text ?? '').replace(/\r\n/g, '\n'),
    html: bodies.html === null ? null : bodies.html.replace(/\r\n/g, '\n'),
  };
}
