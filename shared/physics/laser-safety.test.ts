import { describe, expect, it } from 'vitest'
import { intensityWPerCm2, laserSafetyAdvisories, SAFETY_DEFERRAL } from './laser-safety'

const base = { maxCwPowerW: 0, maxPeakPowerW: 0, effectiveAreaUm2: 80, isFibre: true }
const codes = (a: ReturnType<typeof laserSafetyAdvisories>) => a.map((x) => x.code)

describe('laser-safety advisories', () => {
  it('converts power over area to W/cm² (1 µm² = 1e-8 cm²)', () => {
    expect(intensityWPerCm2(1, 1)).toBe(1e8)
  })

  it('flags intensity above the 1 GW/cm² default guideline and honours a custom guideline', () => {
    // 10 W in 1 µm² = 1e9 W/cm²: exactly at the guideline is allowed, above is not.
    expect(codes(laserSafetyAdvisories({ ...base, maxPeakPowerW: 10, effectiveAreaUm2: 1 }))).not.toContain('damage-intensity')
    expect(codes(laserSafetyAdvisories({ ...base, maxPeakPowerW: 11, effectiveAreaUm2: 1 }))).toContain('damage-intensity')
    expect(codes(laserSafetyAdvisories({ ...base, maxPeakPowerW: 11, effectiveAreaUm2: 1, damageIntensityWPerCm2: 1e10 }))).not.toContain('damage-intensity')
  })

  it('warns of the fibre fuse from 1 W CW in fibre only (Kashyap & Blow 1988)', () => {
    expect(codes(laserSafetyAdvisories({ ...base, maxCwPowerW: 0.99 }))).not.toContain('fibre-fuse')
    expect(codes(laserSafetyAdvisories({ ...base, maxCwPowerW: 1 }))).toContain('fibre-fuse')
    expect(codes(laserSafetyAdvisories({ ...base, maxCwPowerW: 1, isFibre: false }))).not.toContain('fibre-fuse')
  })

  it('hints Class 4 above 500 mW CW (IEC 60825-1) and defers to the laser safety officer', () => {
    expect(codes(laserSafetyAdvisories({ ...base, maxCwPowerW: 0.5 }))).not.toContain('laser-class-4')
    const a = laserSafetyAdvisories({ ...base, maxCwPowerW: 0.6 }).find((x) => x.code === 'laser-class-4')!
    expect(a.message).toContain(SAFETY_DEFERRAL)
    expect(a.message).toMatch(/not a safety assessment/)
  })

  it('asks for an isolator when the Stokes return exceeds 10 % of the pump', () => {
    expect(codes(laserSafetyAdvisories({ ...base, stokesToPumpRatio: 0.05 }))).not.toContain('back-reflection')
    expect(codes(laserSafetyAdvisories({ ...base, stokesToPumpRatio: 0.2 }))).toContain('back-reflection')
  })

  it('says nothing for a 1 mW source', () => {
    expect(laserSafetyAdvisories({ ...base, maxCwPowerW: 1e-3, maxPeakPowerW: 1e-3 })).toEqual([])
  })
})
