/**
 * A small reader of MIME messages, enough for what the fake mail server
 * catches: RFC 5322 headers (folded lines, RFC 2047 encoded words) and
 * single-part or nested multipart bodies in 7bit, 8bit, quoted-printable or
 * base64. It keeps the first text/plain and the first text/html part.
 */

export interface ParsedMail {
  headers: Map<string, string>;
  subject: string;
  from: string;
  to: string;
  text: string;
  html: string;
}

function splitHead(raw: string): { head: string; body: string } {
  const m = /\r?\n\r?\n/.exec(raw);
  if (!m) return { head: raw, body: '' };
  return { head: raw.slice(0, m.index), body: raw.slice(m.index + m[0].length) };
}

/** Header names lower-cased; folded continuation lines joined. The first of a repeated header wins. */
export function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const i = line.indexOf(':');
    if (i <= 0) continue;
    const name = line.slice(0, i).trim().toLowerCase();
    if (!headers.has(name)) headers.set(name, line.slice(i + 1).trim());
  }
  return headers;
}

function decodeBytes(bytes: Buffer, charset = 'utf-8'): string {
  try {
    return new TextDecoder(charset.toLowerCase()).decode(bytes);
  } catch {
    return bytes.toString('utf8');
  }
}

function quotedPrintableBytes(s: string, underscoreIsSpace = false): Buffer {
  const src = (underscoreIsSpace ? s.replace(/_/g, ' ') : s).replace(/=\r?\n/g, '');
  const out: number[] = [];
  for (let i = 0; i < src.length; i++) {
    const hex = src.slice(i + 1, i + 3);
    if (src[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      out.push(parseInt(hex, 16));
      i += 2;
    } else {
      out.push(...Buffer.from(src[i], 'utf8'));
    }
  }
  return Buffer.from(out);
}

/** RFC 2047 encoded words (=?charset?Q|B?text?=); adjacent words join without the space between. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/(\?=)\s+(=\?)/g, '$1$2')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, charset: string, enc: string, text: string) =>
      decodeBytes(enc.toUpperCase() === 'B' ? Buffer.from(text, 'base64') : quotedPrintableBytes(text, true), charset),
    );
}

/** The value of a header parameter, e.g. boundary or charset. */
function headerParam(value: string, name: string): string | undefined {
  const m = new RegExp(`;\\s*${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(value);
  return m ? (m[1] ?? m[2]) : undefined;
}

function decodeBody(body: string, headers: Map<string, string>): string {
  const encoding = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = headerParam(headers.get('content-type') ?? '', 'charset') ?? 'utf-8';
  if (encoding === 'base64') return decodeBytes(Buffer.from(body.replace(/\s+/g, ''), 'base64'), charset);
  if (encoding === 'quoted-printable') return decodeBytes(quotedPrintableBytes(body), charset);
  return body;
}

function collectParts(head: Map<string, string>, body: string, out: { text?: string; html?: string }) {
  const type = (head.get('content-type') ?? 'text/plain').toLowerCase();
  if (type.startsWith('multipart/')) {
    const boundary = headerParam(head.get('content-type') ?? '', 'boundary');
    if (!boundary) return;
    const delimiter = `--${boundary}`;
    const sections = body.split(delimiter).slice(1);
    for (const section of sections) {
      if (section.startsWith('--')) break; // closing delimiter
      const part = splitHead(section.replace(/^\r?\n/, ''));
      collectParts(parseHeaders(part.head), part.body.replace(/\r?\n$/, ''), out);
    }
    return;
  }
  if (type.startsWith('text/html')) out.html ??= decodeBody(body, head);
  else if (type.startsWith('text/plain')) out.text ??= decodeBody(body, head);
}

export function parseMail(raw: string): ParsedMail {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  const parts: { text?: string; html?: string } = {};
  collectParts(headers, body, parts);
  return {
    headers,
    subject: decodeEncodedWords(headers.get('subject') ?? ''),
    from: decodeEncodedWords(headers.get('from') ?? ''),
    to: decodeEncodedWords(headers.get('to') ?? ''),
    text: parts.text ?? '',
    html: parts.html ?? '',
  };
}
