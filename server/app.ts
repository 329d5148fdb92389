import { existsSync } from 'node:fs'
import { join } from 'node:path'
import cookieParser from 'cookie-parser'
import express, { type Express, type Router } from 'express'
import type { Db, Pool } from './db/client'
import { AppError } from './errors'
import type { Logger } from './logger'
import { apiNotFound, errorHandler } from './middleware/error-handler'
import { jsonBodies } from './middleware/json-bodies'
import { requestContext } from './middleware/request-id'
import { sameOriginWrites } from './middleware/same-origin-writes'
import { securityHeaders, warnOnPlainHttp } from './middleware/security-headers'
import { accountRoutes } from './modules/auth/account-routes'
import { authenticate } from './modules/auth/auth.middleware'
import type { AuthOptions } from './modules/auth/auth-options'
import { healthRoutes } from './modules/health/health.routes'
import { openApiRoutes } from './openapi/openapi.routes'
import type { QueueCheck } from './modules/health/health.service'
import { APP_VERSION } from './version'

/** Everything a route may need, passed in so tests can hand over a test database or a broken pool. */
export interface AppDeps {
  db: Db
  pool: Pool
  log: Logger
  version: string
  /** Supplied by the job service once it runs; health reports 'not-configured' without it. */
  queueCheck?: QueueCheck
  /** The built client (vite build); served with an SPA fallback when the folder exists. */
  distDir?: string
  /** Largest JSON body accepted; bigger bodies get 413. */
  jsonLimit?: string
  /** Session secret, mailed-link origin and rate limits; tests and dev get a per-process secret. */
  auth?: Partial<AuthOptions>
  /** Extra routers mounted under /api by later modules: [path, router]. */
  routes?: Array<[string, Router]>
}

export const DEFAULT_JSON_LIMIT = '1mb'

export function createApp(input: Omit<AppDeps, 'version'> & { version?: string }): Express {
  const deps: AppDeps = { version: APP_VERSION, ...input }
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')

  const publicUrl = deps.auth?.appUrl
  warnOnPlainHttp(deps.log, publicUrl)
  app.use(requestContext(deps.log))
  app.use(securityHeaders(publicUrl))
  // Before any body is read: cross-site writes and non-JSON bodies are refused (DEVELOPERS.md, "Writes from browsers").
  app.use('/api', sameOriginWrites(publicUrl), jsonBodies)
  app.use(express.json({ limit: deps.jsonLimit ?? DEFAULT_JSON_LIMIT }))
  app.use(cookieParser())

  const api = express.Router()
  // req.auth for every API route (session cookie or Bearer token); the policy checks read it.
  api.use(authenticate(deps))
  api.use(healthRoutes(deps))
  api.use(openApiRoutes(deps))
  api.use(accountRoutes(deps))
  for (const [path, router] of deps.routes ?? []) api.use(path, router)
  // New modules mount their routers here (or pass them through deps.routes).
  api.use(apiNotFound)
  app.use('/api', api)

  if (deps.distDir && existsSync(join(deps.distDir, 'index.html'))) {
    const index = join(deps.distDir, 'index.html')
    app.use(express.static(deps.distDir, { index: false, maxAge: '1h' }))
    // Client-side routes (deep links) get the app shell; the router draws its own not-found view.
    app.get('/{*splat}', (_req, res) => res.set('Cache-Control', 'no-cache').sendFile(index))
  }

  app.use((req, _res, next) => next(new AppError('not_found', 404, `Nothing at ${req.method} ${req.path}`)))
  app.use(errorHandler)
  return app
}
