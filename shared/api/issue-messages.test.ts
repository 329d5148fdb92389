import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { GaussianPulse } from '../physics/pulse'
import { Waveguide } from '../physics/waveguide'
import { plainIssueMessage } from './issue-messages'
import { describeIssuePath } from './issue-path-labels'
import { unitOfKey } from './key-units'

const messages = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value)
  return r.success ? [] : r.error.issues.map((i) => `${describeIssuePath(i.path, 1)}: ${i.message}`)
}
const pulse = { shape: 'gaussian', peakPowerW: 1, centreNs: 1, fwhmNs: 0.2 }

describe('validation messages in plain words', () => {
  it('states a lower bound with the unit of the field, exclusive and inclusive', () => {
    expect(messages(GaussianPulse, { ...pulse, fwhmNs: 0 })).toEqual(['Width: must be more than 0 ns'])
    expect(messages(GaussianPulse, { ...pulse, peakPowerW: -1 })).toEqual(['Peak power: must be at least 0 W'])
  })

  it('states an upper bound with its unit, and n₂ in m²/W', () => {
    expect(messages(GaussianPulse, { ...pulse, peakPowerW: 2e9 })).toEqual(['Peak power: must be at most 1e9 W'])
    expect(unitOfKey('kerrN2M2PerW')).toBe('m²/W')
    expect(messages(Waveguide, { kerrN2M2PerW: 1 }).find((m) => m.startsWith('Kerr index'))).toBe('Kerr index: must be at most 1e-15 m²/W')
  })

  it('says a value is missing, not a number, or not finite in the reader\'s words', () => {
    expect(messages(GaussianPulse, { ...pulse, centreNs: undefined })).toEqual(['Centre time: is required'])
    expect(messages(GaussianPulse, { ...pulse, centreNs: Number.NaN })).toEqual(['Centre time: must be a number'])
    expect(messages(GaussianPulse, { ...pulse, centreNs: 'soon' })).toEqual(['Centre time: must be a number'])
    expect(messages(z.object({ n: z.number().int() }), { n: 1.5 })).toEqual(['N: must be a whole number'])
  })

  it('counts characters and entries for text and lists', () => {
    expect(messages(z.object({ title: z.string().min(1).max(3) }), { title: 'abcd' })).toEqual(['Title: must have at most 3 characters'])
    expect(messages(z.object({ title: z.string().min(1) }), { title: '' })).toEqual(['Title: must not be empty'])
    expect(messages(z.object({ seed: z.array(z.number()).min(2) }), { seed: [1] })).toEqual(['Seed: must have at least 2 entries'])
  })

  it('names a sweep axis and its values in words, not by their keys', () => {
    expect(describeIssuePath(['axes', 0, 'values', 'count'], 1)).toBe('Sweep axis 1, number of values')
    expect(describeIssuePath(['axes', 1, 'tiedLabels', 0], 1)).toBe('Sweep axis 2, tied label 1')
    expect(describeIssuePath(['axes', 0, 'values'], 1)).toBe('Sweep axis 1, values')
    expect(describeIssuePath(['baseConfig', 'channels', 0, 'pump', 'pulses', 1, 'fwhmNs'], 1)).toBe('Base configuration, pump pulse 2, width')
  })

  it('keeps a message the schema states itself', () => {
    expect(messages(Waveguide, { name: '   ' }).find((m) => m.startsWith('Name'))).toBe('Name: must not be empty')
    expect(messages(z.object({ x: z.number().positive('must be above the floor') }), { x: -1 })).toEqual(['X: must be above the floor'])
  })

  it('leaves no validator wording in any message', () => {
    const raw = /Too small|Too big|Invalid input|expected number|received|>=|<=|\bnan\b/i
    const all = [
      ...messages(GaussianPulse, { shape: 'gaussian', peakPowerW: -1, centreNs: 'x', fwhmNs: 0 }),
      ...messages(Waveguide, { lengthM: -1, groupIndex: Number.POSITIVE_INFINITY, effectiveAreaUm2: 0, polarisationFactor: 2 }),
      ...messages(z.object({ kind: z.enum(['a', 'b']), mail: z.email(), id: z.uuid() }), { kind: 'c', mail: 'x', id: 'y' }),
    ]
    expect(all.length).toBeGreaterThan(6)
    for (const m of all) expect(m).not.toMatch(raw)
  })

  it('maps the issue codes directly', () => {
    expect(plainIssueMessage({ code: 'too_small', origin: 'number', minimum: 0, inclusive: false, path: ['fwhmNs'] })).toBe('must be more than 0 ns')
    expect(plainIssueMessage({ code: 'too_big', origin: 'number', maximum: 5, inclusive: false, path: ['lengthM'] })).toBe('must be less than 5 m')
    expect(plainIssueMessage({ code: 'too_big', origin: 'array', maximum: 3, exact: true, path: ['x'] })).toBe('must have exactly 3 entries')
    expect(plainIssueMessage({ code: 'custom', path: ['x'] })).toBeUndefined()
  })
})
