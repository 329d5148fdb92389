// The HTML part of a mail: the text part's paragraphs, with every absolute URL made a link. The text
// part stays the reference (full URLs, readable anywhere); HTML only makes them clickable.

const escapeHtml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')

const URL_RE = /https?:\/\/[^\s<>"')]+/g

function linkify(escaped: string): string {
  return escaped.replace(URL_RE, (u) => `<a href="${u}">${u}</a>`)
}

/** Blocks separated by blank lines become paragraphs; indented or table-like blocks stay preformatted. */
export function htmlFromText(text: string): string {
  const [body, signature] = text.split('\n\n-- \n')
  const blocks = body.split(/\n{2,}/).map((b) => {
    const pre = b.split('\n').length > 1 && /\S {2,}\S/.test(b)
    const inner = linkify(escapeHtml(b))
    return pre ? `<pre style="font-family:monospace">${inner}</pre>` : `<p>${inner.replace(/\n/g, '<br>')}</p>`
  })
  const foot = signature ? `<p style="color:#666">— ${linkify(escapeHtml(signature))}</p>` : ''
  return `<!doctype html><html><body style="font-family:sans-serif;line-height:1.4">${blocks.join('\n')}${foot}</body></html>`
}
