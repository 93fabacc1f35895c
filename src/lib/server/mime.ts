/**
 * Just enough MIME (RFC 2045–2047) to show the fake SMTP server's messages on the outbox
 * page: header unfolding, encoded-word headers, multipart bodies, and quoted-printable /
 * base64 transfer encodings, all as UTF-8. Messages here come from our own nodemailer, so
 * anything fancier (other charsets, nested attachments) is shown raw rather than decoded.
 */

export interface ReadMessage {
  headers: Record<string, string>;
  /** The text/plain body (decoded), or '' when there is none. */
  text: string;
}

const utf8 = new TextDecoder('utf-8');

function splitHead(raw: string): [string, string] {
  const m = raw.match(/\r?\n\r?\n/);
  if (!m || m.index === undefined) return [raw, ''];
  return [raw.slice(0, m.index), raw.slice(m.index + m[0].length)];
}

export function parseHeaders(head: string): Record<string, string> {
  const out: Record<string, string> = {};
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const i = line.indexOf(':');
    if (i <= 0) continue;
    const name = line.slice(0, i).trim().toLowerCase();
    out[name] ??= line.slice(i + 1).trim();
  }
  return out;
}

function bytesToText(bytes: number[] | Uint8Array): string {
  return utf8.decode(bytes instanceof Uint8Array ? bytes : Uint8Array.from(bytes));
}

export function decodeQuotedPrintable(s: string, headerMode = false): string {
  const src = headerMode ? s.replace(/_/g, ' ') : s.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < src.length; i++) {
    const c = src[i];
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(src.slice(i + 1, i + 3))) {
      bytes.push(parseInt(src.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      for (const b of new TextEncoder().encode(c)) bytes.push(b);
    }
  }
  return bytesToText(bytes);
}

function decodeBase64(s: string): string {
  return bytesToText(Buffer.from(s.replace(/\s+/g, ''), 'base64'));
}

/** "=?UTF-8?Q?Caf=C3=A9?=" → "Café" (RFC 2047); adjacent encoded words join without spaces. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/(=\?[^?]+\?[QqBb]\?[^?]*\?=)\s+(?==\?)/g, '$1')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, charset: string, enc: string, text: string) => {
      if (!/^utf-?8$/i.test(charset) && !/^us-ascii$/i.test(charset)) return text;
      return enc.toUpperCase() === 'B' ? decodeBase64(text) : decodeQuotedPrintable(text, true);
    });
}

function param(contentType: string, name: string): string | null {
  const m = contentType.match(new RegExp(`${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i'));
  return m ? (m[1] ?? m[2]) : null;
}

function decodeBody(body: string, encoding: string | undefined): string {
  switch ((encoding ?? '').toLowerCase()) {
    case 'quoted-printable':
      return decodeQuotedPrintable(body);
    case 'base64':
      return decodeBase64(body);
    default:
      return body;
  }
}

function textPart(headers: Record<string, string>, body: string, depth = 0): string | null {
  const type = headers['content-type'] ?? 'text/plain';
  if (/^multipart\//i.test(type) && depth < 5) {
    const boundary = param(type, 'boundary');
    if (!boundary) return null;
    const parts = body.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?:--)?[ \\t]*\\r?\\n?`));
    for (const part of parts.slice(1)) {
      if (!part.trim()) continue;
      const [h, b] = splitHead(part);
      const found = textPart(parseHeaders(h), b, depth + 1);
      if (found != null) return found;
    }
    return null;
  }
  if (/^text\/plain/i.test(type)) return decodeBody(body, headers['content-transfer-encoding']).replace(/\r\n/g, '\n');
  return null;
}

export function readMessage(raw: string): ReadMessage {
  const [head, body] = splitHead(raw);
  const headers = parseHeaders(head);
  for (const k of ['subject', 'from', 'to']) if (headers[k]) headers[k] = decodeEncodedWords(headers[k]);
  return { headers, text: (textPart(headers, body) ?? '').trimEnd() };
}
