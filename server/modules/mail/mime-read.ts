// Just enough MIME (RFC 2045-2047) to show the mail our own mailer sends in the developer catcher:
// folded headers, encoded-word subjects, multipart/alternative, quoted-printable and base64 bodies.
// It is not a general mail parser and never sees mail from outside.

export interface ReadMessage {
  headers: Record<string, string>
  subject: string
  from: string
  to: string
  text: string
  html: string | null
}

function splitHead(raw: string): { head: string; body: string } {
  const at = raw.search(/\r?\n\r?\n/)
  if (at < 0) return { head: raw, body: '' }
  const sep = raw.slice(at).match(/^\r?\n\r?\n/)![0]
  return { head: raw.slice(0, at), body: raw.slice(at + sep.length) }
}

function parseHeaders(head: string): Record<string, string> {
  const out: Record<string, string> = {}
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ')
  for (const line of unfolded.split(/\r?\n/)) {
    const colon = line.indexOf(':')
    if (colon > 0) out[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim()
  }
  return out
}

function bytesToUtf8(bytes: number[]): string {
  return Buffer.from(bytes).toString('utf8')
}

export function decodeQuotedPrintable(s: string): string {
  const soft = s.replace(/=\r?\n/g, '')
  const bytes: number[] = []
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i]
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      bytes.push(parseInt(soft.slice(i + 1, i + 3), 16))
      i += 2
    } else {
      bytes.push(...Buffer.from(c, 'utf8'))
    }
  }
  return bytesToUtf8(bytes)
}

/** =?charset?Q|B?text?= words in headers (RFC 2047); adjacent words join without the space between. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, _charset: string, enc: string, text: string) =>
      enc.toUpperCase() === 'B' ? Buffer.from(text, 'base64').toString('utf8') : decodeQuotedPrintable(text.replace(/_/g, ' ')),
    )
}

function param(headerValue: string | undefined, name: string): string | undefined {
  const m = headerValue?.match(new RegExp(`${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i'))
  return m ? (m[1] ?? m[2]) : undefined
}

function decodeBody(body: string, encoding: string | undefined): string {
  switch ((encoding ?? '7bit').toLowerCase()) {
    case 'quoted-printable':
      return decodeQuotedPrintable(body)
    case 'base64':
      return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8')
    default:
      return body
  }
}

function collectParts(raw: string, into: { text?: string; html?: string }): Record<string, string> {
  const { head, body } = splitHead(raw)
  const headers = parseHeaders(head)
  const type = (headers['content-type'] ?? 'text/plain').toLowerCase()
  if (type.startsWith('multipart/')) {
    const boundary = param(headers['content-type'], 'boundary')
    if (boundary) {
      const pieces = body.split(`--${boundary}`)
      for (const piece of pieces.slice(1)) {
        if (piece.startsWith('--')) break
        collectParts(piece.replace(/^\r?\n/, ''), into)
      }
    }
  } else if (type.startsWith('text/html')) {
    into.html ??= decodeBody(body, headers['content-transfer-encoding'])
  } else if (type.startsWith('text/')) {
    into.text ??= decodeBody(body, headers['content-transfer-encoding'])
  }
  return headers
}

export function readMessage(raw: string): ReadMessage {
  const parts: { text?: string; html?: string } = {}
  const headers = collectParts(raw, parts)
  return {
    headers,
    subject: decodeEncodedWords(headers.subject ?? ''),
    from: decodeEncodedWords(headers.from ?? ''),
    to: decodeEncodedWords(headers.to ?? ''),
    text: (parts.text ?? '').replace(/\r\n/g, '\n').trimEnd(),
    html: parts.html ?? null,
  }
}
