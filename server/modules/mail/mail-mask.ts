import type { CaughtMail } from './mail-catcher'

/** What replaces a one-time token in held mail shown to someone the mail was not addressed to. */
export const HIDDEN_TOKEN = '[hidden]'

// Mailed links carry their secret in ?token= (confirmation, reset, invitation) or ?share=; a bare
// secret is 32 random bytes in base64url (43 characters), longer than any id we mail.
const TOKEN_PARAM = /([?&](?:token|share|code)=)[^\s&#"'<>]+/gi
const SECRET_LOOKING = /[A-Za-z0-9_-]{40,}/g

export function maskTokens(text: string): string {
  return text.replace(TOKEN_PARAM, `$1${HIDDEN_TOKEN}`).replace(SECRET_LOOKING, HIDDEN_TOKEN)
}

export interface HeldMailView {
  id: string
  receivedAt: string
  recipients: string[]
  subject: string
  from: string
  text: string
  /** True when tokens in the text were hidden because the viewer is not the addressee. */
  masked: boolean
}

/**
 * A held mail as `viewerEmail` may see it: whole when every recipient is the viewer (it is their own
 * mail), otherwise with its tokens hidden. The HTML part is never shown; ours mirror the text.
 */
export function viewOfMail(mail: CaughtMail, viewerEmail: string): HeldMailView {
  const own = mail.recipients.length > 0 && mail.recipients.every((r) => r.toLowerCase() === viewerEmail.toLowerCase())
  const text = own ? mail.text : maskTokens(mail.text)
  return {
    id: mail.id,
    receivedAt: mail.receivedAt,
    recipients: mail.recipients,
    subject: own ? mail.subject : maskTokens(mail.subject),
    from: mail.from,
    text,
    masked: text !== mail.text,
  }
}
