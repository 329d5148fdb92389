// A JSON Schema (as zod renders it for the API description) flattened into rows a person can scan: one row
// per field with its depth, type, whether it is required, its limits and its description. References to
// #/components/schemas are followed (once per branch, so a recursive schema cannot loop).

export type JsonSchema = Record<string, unknown>
export type SchemaComponents = Record<string, JsonSchema>

export interface SchemaRow {
  /** Dotted position, e.g. config.channels[].pump.pulses[]. */
  path: string
  name: string
  depth: number
  type: string
  required: boolean
  limits: string[]
  description?: string
  /** A heading row for one shape of a union, not a field. */
  variant?: boolean
}

const REF = '#/components/schemas/'
export const refName = (s: JsonSchema) => (typeof s.$ref === 'string' && s.$ref.startsWith(REF) ? s.$ref.slice(REF.length) : undefined)

export function resolve(s: JsonSchema, components: SchemaComponents): JsonSchema {
  const name = refName(s)
  return name ? (components[name] ?? {}) : s
}

const variants = (s: JsonSchema) => (s.anyOf ?? s.oneOf) as JsonSchema[] | undefined
const isNull = (s: JsonSchema) => s.type === 'null'

/** string (uuid), integer, array of RunSummary, "a" | "b", object | null … */
export function typeLabel(s: JsonSchema, components: SchemaComponents): string {
  const name = refName(s)
  if (name) return name
  if (s.const !== undefined) return JSON.stringify(s.const)
  if (Array.isArray(s.enum)) return s.enum.map((v) => JSON.stringify(v)).join(' | ')
  const v = variants(s)
  if (v) {
    const objects = v.filter((x) => objectParts(x, components).length > 0)
    if (objects.length > 1 && objects.length === v.length) return `one of ${v.length} kinds of object`
    return v.map((x) => typeLabel(x, components)).join(' | ')
  }
  if (Array.isArray(s.allOf)) return 'object'
  if (s.type === 'array') return `array of ${typeLabel((s.items as JsonSchema) ?? {}, components)}`
  const t = Array.isArray(s.type) ? s.type.join(' | ') : typeof s.type === 'string' ? s.type : 'any'
  if (typeof s.format === 'string') return `${t} (${s.format})`
  if (typeof s.contentMediaType === 'string') return `${t} (${s.contentMediaType})`
  return t
}

/** 1e9 rather than 1000000000; small numbers as JavaScript writes them (1e-15, 0.02). */
const fmt = (n: number) => (Math.abs(n) >= 1e6 ? n.toExponential().replace('e+', 'e') : String(n))

/** Limits a client must respect, written the way a reader checks them. */
export function limits(s: JsonSchema): string[] {
  const out: string[] = []
  // zod writes the safe-integer bounds on every integer; they say nothing to a reader.
  const num = (k: string) => (typeof s[k] === 'number' && Math.abs(s[k] as number) < Number.MAX_SAFE_INTEGER ? (s[k] as number) : undefined)
  const range = (lo: number | undefined, hi: number | undefined, what: string) => {
    if (lo !== undefined && hi !== undefined) out.push(`${what}${fmt(lo)}…${fmt(hi)}`)
    else if (lo !== undefined) out.push(`${what}≥ ${fmt(lo)}`)
    else if (hi !== undefined) out.push(`${what}≤ ${fmt(hi)}`)
  }
  range(num('minimum'), num('maximum'), '')
  if (num('exclusiveMinimum') !== undefined) out.push(`> ${fmt(num('exclusiveMinimum')!)}`)
  if (num('exclusiveMaximum') !== undefined) out.push(`< ${fmt(num('exclusiveMaximum')!)}`)
  range(num('minLength'), num('maxLength'), 'length ')
  range(num('minItems'), num('maxItems'), 'items ')
  if (s.default !== undefined) out.push(`default ${JSON.stringify(s.default)}`)
  if (typeof s.pattern === 'string' && s.format === undefined) out.push('pattern')
  return out
}

/** The object shape(s) a schema describes, merged through allOf and past a `| null`. */
function objectParts(s: JsonSchema, components: SchemaComponents): JsonSchema[] {
  const r = resolve(s, components)
  if (Array.isArray(r.allOf)) return (r.allOf as JsonSchema[]).flatMap((p) => objectParts(p, components))
  const v = variants(r)
  if (v) {
    const nonNull = v.filter((x) => !isNull(x))
    return nonNull.length === 1 ? objectParts(nonNull[0], components) : []
  }
  if (r.type === 'array') return []
  return r.properties ? [r] : []
}

/** What a field's own fields hang from: the items of an array, else the field itself. */
function childrenOf(s: JsonSchema, components: SchemaComponents): { schema: JsonSchema; suffix: string } {
  const r = resolve(s, components)
  if (r.type === 'array' && r.items) return { schema: r.items as JsonSchema, suffix: '[]' }
  return { schema: s, suffix: '' }
}

/** Rows for every field down to maxDepth; a union of object shapes lists each shape's fields under "variant n". */
export function schemaRows(schema: JsonSchema, components: SchemaComponents, maxDepth = 8): SchemaRow[] {
  const rows: SchemaRow[] = []
  const visit = (s: JsonSchema, prefix: string, depth: number, seen: Set<string>) => {
    if (depth > maxDepth) return
    const child = childrenOf(s, components)
    const names = [refName(s), refName(child.schema)].filter((n): n is string => n !== undefined)
    if (names.some((n) => seen.has(n))) return
    const next = names.length ? new Set([...seen, ...names]) : seen
    const target = resolve(child.schema, components)
    const v = variants(target)?.filter((x) => !isNull(x))
    if (v && v.length > 1) {
      v.forEach((variant, i) => {
        const parts = objectParts(variant, components)
        if (parts.length === 0) return
        const label = variantLabel(variant, components) ?? `kind ${i + 1}`
        rows.push({ path: `${prefix}${child.suffix}<${label}>`, name: label, depth, type: 'object', required: false, limits: [], variant: true })
        fields(parts, `${prefix}${child.suffix}`, depth + 1, next)
      })
      return
    }
    fields(objectParts(child.schema, components), `${prefix}${child.suffix}`, depth, next)
  }
  const fields = (parts: JsonSchema[], prefix: string, depth: number, seen: Set<string>) => {
    for (const part of parts) {
      const required = new Set((part.required as string[]) ?? [])
      for (const [key, raw] of Object.entries((part.properties as Record<string, JsonSchema>) ?? {})) {
        const s = resolve(raw, components)
        const path = prefix ? `${prefix}.${key}` : key
        const description = (typeof raw.description === 'string' ? raw.description : undefined) ?? (typeof s.description === 'string' ? s.description : undefined)
        rows.push({ path, name: key, depth, type: typeLabel(raw, components), required: required.has(key) && raw.default === undefined, limits: limits(s), description })
        visit(raw, path, depth + 1, seen)
      }
    }
  }
  visit(schema, '', 0, new Set())
  return rows
}

/** kind: "list" for a variant told apart by a constant field. */
function variantLabel(s: JsonSchema, components: SchemaComponents): string | undefined {
  for (const part of objectParts(s, components)) {
    for (const [k, p] of Object.entries((part.properties as Record<string, JsonSchema>) ?? {})) {
      if (p.const !== undefined) return `${k}: ${JSON.stringify(p.const)}`
    }
  }
  return undefined
}
