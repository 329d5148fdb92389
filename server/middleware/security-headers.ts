import type { RequestHandler } from 'express'
import helmet from 'helmet'
import type { Logger } from '../logger'
import { runtimeMode } from '../env'

/**
 * Response headers that keep the app page from being framed, sniffed or made to run foreign code.
 * The Content-Security-Policy is the narrowest the built client passes in Chromium
 * (tests/e2e/security-headers.test.ts visits every page and fails on any violation):
 * - script-src 'self': the build has no inline script and no eval (Zod's compiled parsers, which
 *   would use `new Function`, are switched off in src/zod-jitless.ts).
 * - style-src 'self' 'unsafe-inline', both halves measured in Chromium: without inline <style>
 *   elements (style-src-elem) Vuetify cannot write its theme colours, which it does at run time; without
 *   inline style attributes (style-src-attr) ECharts' tooltips, HTML with style="…", lose their layout.
 *   A nonce would need the app shell templated per response and still not cover the attributes.
 *   Inline styles cannot run code; scripts stay 'self' only.
 * - img-src data: blob: for the charts' "save as image"; font-src data: for the font subsets the
 *   build inlines into its CSS.
 * - frame-ancestors 'none' (and X-Frame-Options DENY for older browsers): no page may frame us.
 * HSTS and upgrade-insecure-requests only when the public address is https: on plain http they
 * would break a local or intranet install.
 */
export function securityHeaders(publicUrl: string | undefined): RequestHandler {
  const https = publicUrl?.startsWith('https://') === true
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        scriptSrcAttr: ["'none'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    frameguard: { action: 'deny' },
    strictTransportSecurity: https ? { maxAge: 180 * 86_400, includeSubDomains: false } : false,
    // Not no-referrer: under it a browser sends "Origin: null" on its own POSTs, which the
    // same-origin check would refuse; same-origin still keeps ?token= and ?share= URLs from leaving.
    referrerPolicy: { policy: 'same-origin' },
  })
}

/** Says at start-up when production serves sign-ins without TLS, where cookies can be read on the wire. */
export function warnOnPlainHttp(log: Logger, publicUrl: string | undefined): void {
  if (runtimeMode() !== 'production' || publicUrl?.startsWith('https://')) return
  log.warn(
    { publicUrl: publicUrl ?? null },
    'production without an https PUBLIC_URL: session cookies are marked Secure only when a proxy reports https (X-Forwarded-Proto); serve Sonoweave over https and set PUBLIC_URL to that address',
  )
}
