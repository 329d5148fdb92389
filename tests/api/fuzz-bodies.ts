// Hostile request bodies and queries for the API fuzz test: a route's valid skeleton, mutated at the field
// paths its zod schema declares (optional fields included) with NUL, lone surrogates, huge strings,
// huge, tiny, negative and non-finite numbers, wrong types, deep nesting and extra keys. Seeded, so a
// failure replays exactly.
import type { z } from 'zod'
import { hasLoneSurrogates } from '@shared/api/text'

export type Kind = 'string' | 'number' | 'boolean' | 'array' | 'object' | 'other'
export interface FieldPath {
  path: Array<string | number>
  kind: Kind
}

/** mulberry32: a tiny seeded generator (Tommy Ettinger's public-domain PRNG). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

interface Def {
  type: string
  shape?: Record<string, z.ZodType>
  innerType?: z.ZodType
  element?: z.ZodType
  options?: z.ZodType[]
  left?: z.ZodType
  right?: z.ZodType
  in?: z.ZodType
  out?: z.ZodType
  valueType?: z.ZodType
  getter?: () => z.ZodType
}
const defOf = (s: z.ZodType) => (s as unknown as { _zod: { def: Def } })._zod.def

/** Every field path a schema declares, with the kind of value it expects (arrays contribute index 0). */
export function fieldPaths(schema: z.ZodType, prefix: Array<string | number> = [], depth = 0, out: FieldPath[] = []): FieldPath[] {
  if (depth > 12) return out
  const d = defOf(schema)
  const add = (kind: Kind) => {
    if (!out.some((p) => p.kind === kind && p.path.join('.') === prefix.join('.'))) out.push({ path: prefix, kind })
  }
  switch (d.type) {
    case 'object':
      add('object')
      for (const [k, v] of Object.entries(d.shape ?? {})) fieldPaths(v, [...prefix, k], depth + 1, out)
      break
    case 'optional':
    case 'nullable':
    case 'default':
    case 'prefault':
    case 'readonly':
    case 'catch':
    case 'nonoptional':
      fieldPaths(d.innerType!, prefix, depth, out)
      break
    case 'array':
      add('array')
      fieldPaths(d.element!, [...prefix, 0], depth + 1, out)
      break
    case 'union':
      for (const o of d.options ?? []) fieldPaths(o, prefix, depth, out)
      break
    case 'intersection':
      fieldPaths(d.left!, prefix, depth, out)
      fieldPaths(d.right!, prefix, depth, out)
      break
    case 'pipe':
      fieldPaths(d.in!, prefix, depth, out)
      break
    case 'record':
      add('object')
      fieldPaths(d.valueType!, [...prefix, 'key'], depth + 1, out)
      break
    case 'lazy':
      fieldPaths(d.getter!(), prefix, depth + 1, out)
      break
    case 'string':
    case 'email':
    case 'uuid':
    case 'enum':
    case 'literal':
      add('string')
      break
    case 'number':
    case 'int':
    case 'bigint':
      add('number')
      break
    case 'boolean':
      add('boolean')
      break
    default:
      add('other')
  }
  return out
}

// JSON cannot write NaN or Infinity; these tokens are spliced into the text, where JSON.parse reads 1e999 as Infinity.
const RAW = (token: string) => `@@raw:${token}@@`
const RAW_TOKENS = ['1e999', '-1e999', '-0', '1e308', '5e-324', '-5e-324', '1E+400', '0.0000000000000000000000000000001e-400']

export const NASTY_STRINGS = [
  '\u0000',
  'run\u0000title',
  '\ud800',
  'name \udfff',
  '\ud83d',
  'x'.repeat(100_000),
  '',
  '   ',
  'NaN',
  'Infinity',
  '-0',
  '1e308',
  '\u0007\u001b[31m',
  '\u202eevil',
  '\ufeff',
  "'; drop table runs; --",
  '%00',
  '../../etc/passwd',
  '00000000-0000-0000-0000-000000000000',
  '😀'.repeat(500),
]
export const NASTY_NUMBERS: unknown[] = [1e308, -1e308, Number.MAX_VALUE, Number.MIN_VALUE, -Number.MIN_VALUE, -1, 0, 2 ** 53 + 2, -(2 ** 31), 1.5, 1e21, 1e-300, ...RAW_TOKENS.map(RAW)]
export const WRONG_TYPES: unknown[] = [null, true, false, [], {}, 'a string', 42, [[[]]], { $gt: '' }, [null], JSON.parse('{"__proto__": {"isAdmin": true}}')]

function deep(depth: number): unknown {
  let v: unknown = 1
  for (let i = 0; i < depth; i++) v = i % 2 ? { a: v } : [v]
  return v
}

function pick<T>(rnd: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rnd() * xs.length)]
}

function nastyFor(kind: Kind, rnd: () => number): unknown {
  const r = rnd()
  if (r < 0.15) return pick(rnd, WRONG_TYPES)
  if (r < 0.2) return deep(1 + Math.floor(rnd() * 3000))
  if (kind === 'string') return pick(rnd, NASTY_STRINGS)
  if (kind === 'number') return pick(rnd, NASTY_NUMBERS)
  if (kind === 'array') return rnd() < 0.5 ? Array.from({ length: 5000 }, () => pick(rnd, [...NASTY_NUMBERS, ...NASTY_STRINGS.slice(0, 5)])) : [pick(rnd, WRONG_TYPES)]
  return pick(rnd, [...NASTY_STRINGS, ...NASTY_NUMBERS, ...WRONG_TYPES])
}

function setAt(target: unknown, path: Array<string | number>, value: unknown): unknown {
  if (path.length === 0) return value
  const [head, ...rest] = path
  const base = (target !== null && typeof target === 'object' ? (Array.isArray(target) ? [...target] : { ...target }) : typeof head === 'number' ? [] : {}) as Record<string | number, unknown>
  base[head] = setAt(base[head], rest, value)
  return base
}

/** One mutated body: 1–3 field mutations of the skeleton, or a whole-body mutation. */
export function mutateBody(skeleton: unknown, paths: FieldPath[], rnd: () => number): unknown {
  const r = rnd()
  if (r < 0.06) return pick(rnd, [null, [], 'body', 7, deep(2000), [skeleton]])
  if (r < 0.12) return { ...(skeleton as object), [pick(rnd, ['extra', '__proto__', 'constructor', 'isAdmin', 'x'.repeat(1000)])]: pick(rnd, [...WRONG_TYPES, ...NASTY_STRINGS.slice(0, 4)]) }
  let body = structuredClone(skeleton)
  const n = 1 + Math.floor(rnd() * 3)
  for (let i = 0; i < n && paths.length > 0; i++) {
    const f = pick(rnd, paths)
    body = setAt(body, f.path, nastyFor(f.kind, rnd))
  }
  return body
}

/**
 * One body per declared field for the values most likely to break it, so no field depends on luck: NUL
 * and a lone surrogate in every string, one hostile number in every number (the list rotates over the
 * fields), a wrong type in every array, object and boolean.
 */
export function plannedBodies(skeleton: unknown, paths: FieldPath[]): unknown[] {
  const out: unknown[] = []
  let k = 0
  for (const f of paths) {
    if (f.kind === 'string') out.push(setAt(skeleton, f.path, 'x\u0000y'), setAt(skeleton, f.path, 'x\ud800'))
    else if (f.kind === 'number') out.push(setAt(skeleton, f.path, NASTY_NUMBERS[k++ % NASTY_NUMBERS.length]))
    else out.push(setAt(skeleton, f.path, WRONG_TYPES[k++ % WRONG_TYPES.length]))
  }
  return out
}

/** JSON text of a body, with the raw number tokens spliced in. */
export function toJsonText(body: unknown): string {
  return (JSON.stringify(body) ?? 'null').replace(/"@@raw:([^@]+)@@"/g, '$1')
}

/** A query string: the skeleton's values with some replaced, repeated or malformed (already percent-encoded). */
export function mutateQuery(skeleton: Record<string, string>, keys: string[], rnd: () => number): string {
  // A lone surrogate cannot be percent-encoded as UTF-8 (encodeURIComponent throws); send the replacement character.
  const enc = (s: string) => s.replace(/[^A-Za-z0-9._~-]/gu, (c) => (hasLoneSurrogates(c) ? '%EF%BF%BD' : encodeURIComponent(c)))
  const pairs = Object.entries(skeleton).map(([k, v]) => [k, enc(v)])
  const raw = ['%00', 'a%00b', '%ED%A0%80', '%E0%A4%A', '%', '%zz', '1e308', '-0', 'NaN', '-1', '1.5', '99999999999999999999', 'x'.repeat(5000), '%F0%9F%98%80']
  const n = 1 + Math.floor(rnd() * 2)
  for (let i = 0; i < n; i++) {
    const key = pick(rnd, [...keys, 'extra'])
    const r = rnd()
    const value = r < 0.7 ? pick(rnd, raw) : enc(pick(rnd, NASTY_STRINGS).slice(0, 3000))
    if (rnd() < 0.15) pairs.push([key, value])
    else {
      const at = pairs.findIndex((p) => p[0] === key)
      if (at >= 0) pairs[at] = [key, value]
      else pairs.push([key, value])
    }
  }
  if (rnd() < 0.05) pairs.push([`${pick(rnd, keys)}[x]`, '1'])
  return pairs.map(([k, v]) => `${k}=${v}`).join('&')
}

/** Path-parameter values that are not ids: encoded NUL, broken UTF-8, malformed escapes, huge. */
export const NASTY_PATH_SEGMENTS = ['%00', 'a%00', '%ED%A0%80', '%E0%A4%A', '%', '%zz', 'x'.repeat(3000), '..', '%2e%2e', '00000000-0000-0000-0000-000000000000', '-1', '1e308', '%F0%9F%98%80', '%C0%AF']
