import type { ZodType } from 'zod'

/** A Vuetify field rule from the shared schema the API validates with: same limits, same words. */
export function zodRule(schema: ZodType): (value: unknown) => true | string {
  return (value) => {
    const r = schema.safeParse(value)
    return r.success || (r.error.issues[0]?.message ?? 'Not valid')
  }
}

/** Same-app paths only: a crafted ?redirect=https://elsewhere must not take the user off-site. */
export function safeRedirect(value: unknown): string {
  return typeof value === 'string' && value.startsWith('/') && !value.startsWith('//') ? value : '/'
}
