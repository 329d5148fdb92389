import { describe, expect, it } from 'vitest'
import { unitOfField } from './run-format'

describe('unitOfField', () => {
  it.each([
    ['waveguide.forwardResonances.0.antiStokesMismatchPerM', '1/m'],
    ['waveguide.lossDbPerM', 'dB/m'],
    ['waveguide.kerrN2M2PerW', 'm²/W'],
    ['waveguide.gainCoefficientMPerW', 'm/W'],
    ['waveguide.acousticVelocityMPerS', 'm/s'],
    ['waveguide.additionalResonances.0.shiftGHz', 'GHz'],
    ['options.cascade.seedPowerW', 'W'],
    ['channels.0.coProbe.backgroundPowerW', 'W'],
    ['waveguide.lengthM', 'm'],
  ])('%s is in %s', (path, unit) => {
    expect(unitOfField(path)).toBe(unit)
  })
})
