/** The colour each HTTP method wears on the API page: reads calm, writes stronger, deletes as errors. */
export const METHOD_COLOR: Record<string, string> = { get: 'info', post: 'primary', put: 'warning', patch: 'warning', delete: 'error' }

export const AUTH_LABEL: Record<string, { text: string; icon: string }> = {
  public: { text: 'No sign-in', icon: 'mdi-earth' },
  user: { text: 'Token or session', icon: 'mdi-key-outline' },
  admin: { text: 'Administrators', icon: 'mdi-shield-account-outline' },
  shareable: { text: 'Token, session or share link', icon: 'mdi-link-variant' },
}
