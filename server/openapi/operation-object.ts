// One registry entry → one OpenAPI Operation Object: parameters from the path and the query schema,
// the request body, the main response, the error envelope for 4XX/5XX, and who may call it.
import type { JsonSchema, SchemaComponents } from './json-schema'
import type { ApiOperation, AuthMode } from './registry'
import type { RouteSchemas } from './route-walk'

type Requirement = Record<string, string[]>
const SIGNED_IN: Requirement[] = [{ sessionCookie: [] }, { bearerToken: [] }]
const SECURITY: Record<AuthMode, Requirement[]> = {
  public: [],
  user: SIGNED_IN,
  admin: SIGNED_IN,
  shareable: [...SIGNED_IN, { shareToken: [] }],
}
/** /api/runs/:id → /api/runs/{id} */
export const templatePath = (expressPath: string) => expressPath.replace(/:(\w+)/g, '{$1}')

const pathParamNames = (expressPath: string) => [...expressPath.matchAll(/:(\w+)/g)].map((m) => m[1])

function operationId(op: ApiOperation): string {
  const words = op.path.replace(/^\/api\//, '').split(/[/.-]/).filter(Boolean).map((w) => (w.startsWith(':') ? `by ${w.slice(1)}` : w))
  const camel = [op.method.toLowerCase(), ...words.join(' ').split(' ')].map((w, i) => (i === 0 ? w : w[0].toUpperCase() + w.slice(1)))
  return camel.join('')
}

/** Properties of an object schema, looking through the allOf an intersection renders to. */
function objectProperties(schema: JsonSchema): { properties: Record<string, JsonSchema>; required: string[] } {
  const parts = Array.isArray(schema.allOf) ? (schema.allOf as JsonSchema[]) : [schema]
  const properties: Record<string, JsonSchema> = {}
  const required: string[] = []
  for (const p of parts) {
    Object.assign(properties, (p.properties as Record<string, JsonSchema>) ?? {})
    required.push(...((p.required as string[]) ?? []))
  }
  return { properties, required }
}

/** Path and query parameters are listed one by one, so their schemas are written out, never referenced. */
function parameters(op: ApiOperation, schemas: RouteSchemas, components: SchemaComponents): JsonSchema[] {
  const out: JsonSchema[] = []
  const pathProps = schemas.params ? objectProperties(components.inline(schemas.params, 'input')).properties : {}
  for (const name of pathParamNames(op.path)) {
    out.push({ name, in: 'path', required: true, schema: pathProps[name] ?? { type: 'string' } })
  }
  const query = schemas.query ? objectProperties(components.inline(schemas.query, 'input')) : { properties: {}, required: [] }
  for (const [name, schema] of Object.entries(query.properties)) {
    const { description, ...rest } = schema
    out.push({ name, in: 'query', required: query.required.includes(name) && !('default' in rest), schema: rest, ...(description ? { description } : {}) })
  }
  if (op.auth === 'shareable' && !('share' in query.properties)) {
    out.push({ name: 'share', in: 'query', required: false, schema: { type: 'string', maxLength: 200 }, description: 'Token of a share link, for reading without an account' })
  }
  for (const h of op.headers ?? []) out.push({ name: h.name, in: 'header', required: false, schema: { type: 'string' }, description: h.description })
  return out
}

function requestBody(op: ApiOperation, schemas: RouteSchemas, components: SchemaComponents): JsonSchema | undefined {
  if (schemas.body) return { required: true, content: { 'application/json': { schema: components.ref(schemas.body, 'input') } } }
  if (!op.multipart) return undefined
  const properties: Record<string, JsonSchema> = {}
  const encoding: Record<string, JsonSchema> = {}
  for (const [name, part] of Object.entries(op.multipart)) {
    if (part.binary) properties[name] = { type: 'string', contentMediaType: 'application/octet-stream', description: part.description }
    else if (part.schema) {
      properties[name] = { ...components.ref(part.schema, 'input'), description: part.description }
      encoding[name] = { contentType: 'application/json' }
    }
  }
  return { required: true, content: { 'multipart/form-data': { schema: { type: 'object', properties, required: Object.keys(properties) }, encoding } } }
}

function mainResponse(op: ApiOperation, components: SchemaComponents): JsonSchema {
  const r = op.response
  const type = r.contentType ?? (r.schema ? 'application/json' : undefined)
  if (!type) return { description: r.description }
  const media: JsonSchema = {}
  if (r.schema) media.schema = components.ref(r.schema, 'output')
  else if (type === 'application/json') media.schema = {}
  else media.schema = { type: 'string', contentMediaType: type }
  if (r.events) media['x-events'] = Object.fromEntries(Object.entries(r.events).map(([name, s]) => [name, components.ref(s, 'output')]))
  return { description: r.description, content: { [type]: media } }
}

export function operationObject(op: ApiOperation, schemas: RouteSchemas, components: SchemaComponents): JsonSchema {
  const body = requestBody(op, schemas, components)
  return {
    operationId: operationId(op),
    tags: [op.tag],
    summary: op.summary,
    ...(op.description ? { description: op.description } : {}),
    // Who may call it, in one word for readers of the document (security lists the schemes).
    'x-auth': op.auth,
    security: SECURITY[op.auth],
    parameters: parameters(op, schemas, components),
    ...(body ? { requestBody: body } : {}),
    responses: {
      [String(op.response.status)]: mainResponse(op, components),
      '4XX': { $ref: '#/components/responses/Error' },
      '5XX': { $ref: '#/components/responses/Error' },
    },
  }
}
