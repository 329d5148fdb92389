// Zod compiles object parsers with `new Function` unless told not to. The app's Content-Security-Policy
// (script-src 'self', no 'unsafe-eval': server/middleware/security-headers.ts) forbids that, and even
// Zod's probe for it is reported as a violation. The setting is read when a schema is built, so this
// module is main.ts's first import, ahead of every schema in src/ and shared/.
// It also installs the plain wording of validation issues ("must be more than 0 ns") for the browser.
import { z } from 'zod'
import '@shared/api/issue-messages'

z.config({ jitless: true })
