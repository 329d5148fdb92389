import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { limits, schemaRows, typeLabel, type JsonSchema } from './schema-rows'

// Schemas rendered by zod's own z.toJSONSchema, as the server renders the API description.
const json = (s: z.ZodType) => z.toJSONSchema(s, { target: 'draft-2020-12', io: 'input' }) as JsonSchema

const Pulse = z.discriminatedUnion('shape', [
  z.object({ shape: z.literal('gaussian'), fwhmNs: z.number().positive().describe('Power FWHM (ns)') }),
  z.object({ shape: z.literal('sampled'), samples: z.array(z.number()).min(2) }),
])
const Body = z.object({
  title: z.string().min(1).max(200),
  page: z.number().int().min(1).default(1),
  pulses: z.array(Pulse).max(10),
  note: z.string().nullable(),
})

describe('schemaRows', () => {
  it('lists nested fields with their depth, required marks, limits and descriptions', () => {
    const rows = schemaRows(json(Body), {})
    const by = (path: string) => rows.find((r) => r.path === path)!
    expect(by('title')).toMatchObject({ depth: 0, type: 'string', required: true, limits: ['length 1…200'] })
    // A field with a default may be left out, and the safe-integer bound zod adds is not shown.
    expect(by('page')).toMatchObject({ required: false, type: 'integer', limits: ['≥ 1', 'default 1'] })
    expect(by('pulses')).toMatchObject({ type: 'array of one of 2 kinds of object', limits: ['items ≤ 10'] })
    expect(by('note').type).toBe('string | null')
    // Each shape of the union gets a heading row named by its constant field, then its own fields.
    const variant = rows.find((r) => r.variant && r.name === 'shape: "gaussian"')!
    expect(variant.depth).toBe(1)
    expect(by('pulses[].fwhmNs')).toMatchObject({ depth: 2, required: true, limits: ['> 0'], description: 'Power FWHM (ns)' })
    expect(by('pulses[].samples')).toMatchObject({ type: 'array of number', limits: ['items ≥ 2'] })
  })

  it('follows references to components and stops at a schema that contains itself', () => {
    const components: Record<string, JsonSchema> = {
      Node: { type: 'object', properties: { name: { type: 'string' }, children: { type: 'array', items: { $ref: '#/components/schemas/Node' } } }, required: ['name'] },
    }
    const rows = schemaRows({ $ref: '#/components/schemas/Node' }, components)
    expect(rows.map((r) => r.path)).toEqual(['name', 'children'])
    expect(typeLabel(components.Node.properties ? (components.Node.properties as Record<string, JsonSchema>).children : {}, components)).toBe('array of Node')
  })
})

describe('limits', () => {
  it('writes ranges the way a reader checks them', () => {
    expect(limits(json(z.number().min(0).max(1)))).toEqual(['0…1'])
    expect(limits(json(z.number().positive().max(100)))).toEqual(['≤ 100', '> 0'])
    expect(limits(json(z.string().regex(/^[a-z]+$/)))).toEqual(['pattern'])
    expect(limits(json(z.uuid()))).toEqual([])
    expect(limits(json(z.number().min(0).max(1e9)))).toEqual(['0…1e9'])
  })
})
