// The one rule for text a person types: every string field of a request schema is built from safeText(),
// so the form, the API and the worker refuse the same characters with the same message.
//
// Why these characters: PostgreSQL text and jsonb cannot hold U+0000 (an error, not a stored value), and
// a lone UTF-16 surrogate half is not a character at all (jsonb refuses its \uD800 escape; UTF-8 cannot
// encode it). The other C0 controls (except tab, line feed and carriage return) never come from a
// keyboard and garble logs and CSV exports, so they are refused too.
import { z } from 'zod'

export const CONTROL_CHARACTER_MESSAGE = 'must not contain control characters'
export const BROKEN_CHARACTER_MESSAGE = 'contains an incomplete Unicode character; retype or paste the text again'

// C0 controls other than \t \n \r, and DEL.
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/
// A high surrogate not followed by a low one, or a low one not preceded by a high one.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/

export function hasControlCharacters(s: string): boolean {
  return CONTROL.test(s)
}

export function hasLoneSurrogates(s: string): boolean {
  return LONE_SURROGATE.test(s)
}

/** Why a text cannot be stored, or null when it can. */
export function unsafeTextReason(s: string): string | null {
  if (hasControlCharacters(s)) return CONTROL_CHARACTER_MESSAGE
  if (hasLoneSurrogates(s)) return BROKEN_CHARACTER_MESSAGE
  return null
}

/**
 * z.string() that refuses control characters and lone surrogates. Chain .trim(), .min(), .max() as usual;
 * the check runs first, on the text as sent.
 */
export function safeText(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).check((ctx) => {
    const reason = unsafeTextReason(ctx.value)
    if (reason) ctx.issues.push({ code: 'custom', message: reason, input: ctx.value })
  })
}
