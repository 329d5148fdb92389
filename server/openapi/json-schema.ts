// zod schemas → JSON Schema 2020-12 (the dialect of OpenAPI 3.1) with zod's own z.toJSONSchema. Schemas
// exported by name from shared/ become components (#/components/schemas/Name) so the document and the API
// page can name them; anything else (a route's own schema, a list wrapper) is written inline.
import { z } from 'zod'
import { schemaName } from './schema-names'

export type JsonSchema = Record<string, unknown>
export type Io = 'input' | 'output'

const REF_PREFIX = '#/components/schemas/'
const OPTIONS = { target: 'draft-2020-12', unrepresentable: 'any' } as const

/** `$schema` belongs to a whole document and a fragment `$id` is not allowed inside one. */
function clean(schema: JsonSchema): JsonSchema {
  const { $schema: _s, $id: _i, ...rest } = schema
  return rest
}

/**
 * Collects the schemas an API description uses and renders them. A request schema is rendered as its
 * input (what a client may send: defaults optional, coercions widened), a response schema as its output.
 */
export class SchemaComponents {
  private readonly used = { input: new Map<string, z.ZodType>(), output: new Map<string, z.ZodType>() }

  /** A component name per role; a schema used both ways gets an `Input` suffix on the request side. */
  private componentName(name: string, schema: z.ZodType, io: Io): string {
    return io === 'input' && this.used.output.get(name) === schema ? `${name}Input` : name
  }

  /** Records a use; call for every schema before render(). */
  use(schema: z.ZodType, io: Io): void {
    const name = schemaName(schema)
    if (name) this.used[io].set(name, schema)
  }

  /** A reference to a named schema, else the schema inline. Valid after every use() call. */
  ref(schema: z.ZodType, io: Io): JsonSchema {
    const name = schemaName(schema)
    if (name && this.used[io].get(name) === schema) return { $ref: REF_PREFIX + this.componentName(name, schema, io) }
    return this.inline(schema, io)
  }

  /** The schema written out in full, named or not. */
  inline(schema: z.ZodType, io: Io): JsonSchema {
    return clean(z.toJSONSchema(schema, { ...OPTIONS, io }) as JsonSchema)
  }

  /** components.schemas: every named schema recorded, each rendered once. */
  render(): Record<string, JsonSchema> {
    const out: Record<string, JsonSchema> = {}
    for (const io of ['output', 'input'] as const) {
      const registry = z.registry<{ id: string }>()
      for (const [name, schema] of this.used[io]) registry.add(schema, { id: this.componentName(name, schema, io) })
      const { schemas } = z.toJSONSchema(registry, { ...OPTIONS, io, uri: (id) => REF_PREFIX + id })
      for (const [id, s] of Object.entries(schemas)) out[id] = clean(s as JsonSchema)
    }
    return out
  }
}
