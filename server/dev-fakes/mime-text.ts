// Just enough MIME to show a received message: unfolded headers, encoded words (RFC 2047), and a
// text body in 7bit, 8bit, quoted-printable or base64 (RFC 2045), from the first text/plain part.

export interface DecodedMail {
  subject: string;
  from: string | null;
  to: string | null;
  text: string;
}

function splitHead(raw: string) {
  const at = raw.search(/\r?\n\r?\n/);
  const head = at < 0 ? raw : raw.slice(0, at);
  const body = at < 0 ? '' : raw.slice(at).replace(/^\r?\n\r?\n/, '');
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const m = /^([^:]+):\s*(.*)$/.exec(line);
    if (m && !headers.has(m[1].toLowerCase())) headers.set(m[1].toLowerCase(), m[2]);
  }
  return { headers, body };
}

const utf8 = (bytes: number[]) => Buffer.from(bytes).toString('utf8');

export function decodeQuotedPrintable(text: string, inHeader = false): string {
  const bytes: number[] = [];
  const src = inHeader ? text.replace(/_/g, ' ') : text.replace(/=\r?\n/g, '');
  for (let i = 0; i < src.length; i++) {
    if (src[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(src.slice(i + 1, i + 3))) {
      bytes.push(parseInt(src.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(src[i], 'utf8'));
  }
  return utf8(bytes);
}

export function decodeEncodedWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_m, _charset: string, enc: string, data: string) =>
      enc.toUpperCase() === 'B' ? Buffer.from(data, 'base64').toString('utf8') : decodeQuotedPrintable(data, true),
    );
}

function decodeBody(body: string, encoding: string | undefined) {
  const enc = (encoding ?? '7bit').trim().toLowerCase();
  if (enc === 'base64') return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  if (enc === 'quoted-printable') return decodeQuotedPrintable(body);
  return body;
}

function textOf(headers: Map<string, string>, body: string): string | null {
  const type = headers.get('content-type') ?? 'text/plain';
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (/^multipart\//i.test(type) && boundary) {
    for (const part of body.split(`--${boundary}`).slice(1)) {
      if (part.startsWith('--')) break;
      const inner = splitHead(part.replace(/^\r?\n/, ''));
      const found = textOf(inner.headers, inner.body);
      if (found !== null) return found;
    }
    return null;
  }
  if (!/^text\/plain/i.test(type)) return null;
  return decodeBody(body, headers.get('content-transfer-encoding')).replace(/\r\n/g, '\n').replace(/\n$/, '');
}

export function decodeMail(raw: string): DecodedMail {
  const { headers, body } = splitHead(raw);
  const h = (name: string) => (headers.has(name) ? decodeEncodedWords(headers.get(name)!) : null);
  return { subject: h('subject') ?? '', from: h('from'), to: h('to'), text: textOf(headers, body) ?? '' };
}
