// The API's description, one entry per mounted route: method, Express path, who may call it, the shared zod
// schemas of its input and main response, and a one-line summary. server/openapi/document.ts turns the
// entries into the OpenAPI document served at GET /api/openapi.json; tests/api/openapi.test.ts walks the
// mounted routers and fails when a route has no entry, an entry has no route, or an entry's input schema is
// not the very object the route validates with.
import type { z } from 'zod'

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'

/**
 * - public: anyone, signed in or not
 * - user: a session cookie or a Bearer API token
 * - admin: as user, and the account must be a site administrator
 * - shareable: as user, or a `?share=` token of a share link to the resource (read-only)
 */
export type AuthMode = 'public' | 'user' | 'admin' | 'shareable'

export interface ApiResponseSpec {
  status: number
  description: string
  /** JSON body schema (output side); omitted when no shared schema describes the body. */
  schema?: z.ZodType
  /** Defaults to application/json when a schema is given, to no body otherwise. */
  contentType?: string
  /** Server-sent events: event name → schema of its JSON data line. */
  events?: Record<string, z.ZodType>
}

export interface ApiOperation {
  method: HttpMethod
  /** As Express mounts it, e.g. /api/runs/:id/clone. */
  path: string
  tag: string
  summary: string
  description?: string
  auth: AuthMode
  /** The schemas the route validates with (the same objects passed to validate()). */
  body?: z.ZodType
  query?: z.ZodType
  params?: z.ZodType
  /** A multipart/form-data body: part name → what it carries. */
  multipart?: Record<string, { description: string; schema?: z.ZodType; binary?: boolean }>
  /** Request headers the route reads besides Authorization. */
  headers?: Array<{ name: string; description: string }>
  response: ApiResponseSpec
}

export const key = (o: { method: string; path: string }) => `${o.method.toUpperCase()} ${o.path}`
