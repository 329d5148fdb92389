// The OpenAPI 3.1 document: the registry's entries, each with the input schemas its mounted route validates
// with, the error envelope, and the three ways to authenticate.
import { ApiErrorBody } from '@shared/api/api-error'
import { SESSION_COOKIE } from '../modules/auth/auth-options'
import { SchemaComponents, type JsonSchema } from './json-schema'
import { operationObject, templatePath } from './operation-object'
import { key, type ApiOperation } from './registry'
import type { MountedRoute, RouteSchemas } from './route-walk'

export const TAG_DESCRIPTIONS: Record<string, string> = {
  Runs: 'Simulation runs: submit a configuration, follow it, read or download its results.',
  Sweeps: 'Parameter sweeps: one run per point, with a table of figures.',
  Traces: 'Measured traces uploaded for comparison with runs.',
  Fits: 'Fits of a run to a measured trace.',
  Waveguides: "A group's saved waveguides.",
  Groups: 'Research groups, their members and invitations.',
  'Share links': 'Read-only links to runs and sweeps for people without an account.',
  Account: 'Sign-up, sign-in and the signed-in account.',
  'API tokens': 'Tokens for scripts: send one as `Authorization: Bearer <token>`.',
  Administration: 'For site administrators.',
  Service: 'Health and this description.',
}

const AUTH_HOW_TO = [
  'Scripts authenticate with an API token: create one on the API tokens page (or POST /api/tokens) and send it',
  'in every request as `Authorization: Bearer <token>`. Token requests need no Origin header. Browsers use',
  `the ${SESSION_COOKIE} cookie set by POST /api/auth/sign-in. Reads of shared runs and sweeps also accept`,
  '`?share=<token>` from a share link. Every error answers with the envelope in components.schemas.ApiErrorBody;',
  'a 400 from validation lists the offending fields under `error.fields`.',
].join(' ')

/** The route's input schemas: what the mounted route validates with, else what the entry declares. */
function inputSchemas(op: ApiOperation, mounted: Map<string, RouteSchemas>): RouteSchemas {
  const m = mounted.get(key(op)) ?? {}
  return { body: m.body ?? op.body, query: m.query ?? op.query, params: m.params ?? op.params }
}

export function buildOpenApiDocument(operations: readonly ApiOperation[], opts: { version: string; mounted?: MountedRoute[] }): JsonSchema {
  const mounted = new Map((opts.mounted ?? []).map((r) => [key(r), r.schemas]))
  const components = new SchemaComponents()
  components.use(ApiErrorBody, 'output')
  for (const op of operations) {
    const s = inputSchemas(op, mounted)
    if (s.body) components.use(s.body, 'input')
    for (const part of Object.values(op.multipart ?? {})) if (part.schema) components.use(part.schema, 'input')
    if (op.response.schema) components.use(op.response.schema, 'output')
    for (const e of Object.values(op.response.events ?? {})) components.use(e, 'output')
  }

  const paths: Record<string, Record<string, JsonSchema>> = {}
  for (const op of operations) {
    const path = (paths[templatePath(op.path)] ??= {})
    path[op.method.toLowerCase()] = operationObject(op, inputSchemas(op, mounted), components)
  }
  const errorRef = components.ref(ApiErrorBody, 'output')
  const usedTags = new Set(operations.map((o) => o.tag))

  return {
    openapi: '3.1.0',
    info: { title: 'Sonoweave API', version: opts.version, description: AUTH_HOW_TO },
    servers: [{ url: '/' }],
    tags: Object.entries(TAG_DESCRIPTIONS)
      .filter(([name]) => usedTags.has(name))
      .map(([name, description]) => ({ name, description })),
    paths,
    components: {
      schemas: components.render(),
      responses: { Error: { description: 'The error envelope: a code, a message, the fields at fault and the request id', content: { 'application/json': { schema: errorRef } } } },
      securitySchemes: {
        bearerToken: { type: 'http', scheme: 'bearer', description: 'An API token from the API tokens page: `Authorization: Bearer <token>`' },
        sessionCookie: { type: 'apiKey', in: 'cookie', name: SESSION_COOKIE, description: 'The browser session set by POST /api/auth/sign-in' },
        shareToken: { type: 'apiKey', in: 'query', name: 'share', description: 'The token of a share link (read-only access to one run or sweep)' },
      },
    },
  }
}
