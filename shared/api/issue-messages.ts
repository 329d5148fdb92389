// Validation messages in the reader's words, with the field's unit: "must be more than 0 ns", not the
// validator's own "Too small: expected number to be >0". Importing this module installs the wording as
// zod's error map for the whole process (browser, API and workers alike), so every schema in shared/ speaks
// the same way wherever it is checked; a message a schema states itself still wins. Field names come from
// issue-path-labels.ts, units from key-units.ts.
import { z } from 'zod'
import { unitOfKey } from './key-units'

/** The parts of a zod issue the wording reads (zod 4's raw issue, as handed to an error map). */
export interface IssueFacts {
  code: string
  path?: readonly PropertyKey[]
  input?: unknown
  origin?: string
  minimum?: number | bigint | Date
  maximum?: number | bigint | Date
  inclusive?: boolean
  exact?: boolean
  expected?: string
  divisor?: number
  format?: string
  keys?: readonly string[]
}

const EXPECTED: Record<string, string> = {
  number: 'a number',
  int: 'a whole number',
  bigint: 'a whole number',
  string: 'text',
  boolean: 'true or false',
  array: 'a list',
  object: 'a group of fields',
  date: 'a date',
  null: 'empty',
}
const FORMATS: Record<string, string> = { email: 'an e-mail address', uuid: 'an identifier (UUID)', url: 'a web address', datetime: 'a date and time' }
const COUNTED: Record<string, [string, string]> = { string: ['character', 'characters'], array: ['entry', 'entries'], set: ['entry', 'entries'] }

/** 1e9 rather than 1000000000; small and ordinary numbers as JavaScript writes them (0.5, 1e-15). */
function shortNumber(v: number): string {
  if (Math.abs(v) < 1e6) return String(v)
  const [m, e] = v.toExponential().split('e')
  return `${m}e${Number(e)}`
}

/** A bound as written in a sentence: the number and the field's unit ("0 ns", "3"). */
function withUnit(bound: number | bigint | Date | undefined, path: readonly PropertyKey[] | undefined): string {
  const last = path?.at(-1)
  const unit = typeof last === 'string' ? unitOfKey(last) : ''
  const value = bound instanceof Date ? bound.toISOString() : typeof bound === 'number' ? shortNumber(bound) : String(bound)
  return unit ? `${value} ${unit}` : value
}

function counted(n: number | bigint | Date | undefined, origin: string): string {
  const [one, many] = COUNTED[origin]
  return `${String(n)} ${Number(n) === 1 ? one : many}`
}

function bounded(i: IssueFacts, side: 'min' | 'max'): string {
  const bound = side === 'min' ? i.minimum : i.maximum
  const origin = i.origin ?? 'number'
  if (origin in COUNTED) {
    if (i.exact) return `must have exactly ${counted(bound, origin)}`
    if (side === 'min' && Number(bound) === 1) return 'must not be empty'
    return `must have ${side === 'min' ? 'at least' : 'at most'} ${counted(bound, origin)}`
  }
  const v = withUnit(bound, i.path)
  if (side === 'min') return i.inclusive ? `must be at least ${v}` : `must be more than ${v}`
  return i.inclusive ? `must be at most ${v}` : `must be less than ${v}`
}

/** The sentence for an issue, or undefined where the validator's text is already plain (custom checks). */
export function plainIssueMessage(i: IssueFacts): string | undefined {
  switch (i.code) {
    case 'too_small':
      return bounded(i, 'min')
    case 'too_big':
      return bounded(i, 'max')
    case 'invalid_type':
      if (i.input === undefined) return 'is required'
      if (typeof i.input === 'number' && Number.isNaN(i.input)) return 'must be a number'
      if (typeof i.input === 'number' && !Number.isFinite(i.input)) return 'must be a finite number'
      return `must be ${EXPECTED[i.expected ?? ''] ?? i.expected}`
    case 'not_multiple_of':
      return `must be a multiple of ${withUnit(i.divisor, i.path)}`
    case 'invalid_value':
      return i.input === undefined ? 'is required' : 'is not one of the allowed choices'
    case 'invalid_format':
      return `must be ${FORMATS[i.format ?? ''] ?? 'in the expected format'}`
    case 'invalid_union':
      return 'does not match any allowed form'
    case 'unrecognized_keys':
      return `has fields that are not expected: ${(i.keys ?? []).join(', ')}`
    default:
      return undefined
  }
}

z.config({ customError: (iss) => plainIssueMessage(iss as IssueFacts) })
