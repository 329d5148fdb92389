import { describe, expect, it } from 'vitest'
import { SimulationConfig } from './simulation-config'
import { applySweepValue, fieldProblem, readSweepValue, sweepField, SWEEP_FIELD_IDS, SWEEP_FIELDS } from './sweep-fields'
import { WAVE_SWEEP_FIELD_IDS } from './sweep-fields-waves'

const chip = { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 6.9e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 }
const cw = { pulses: [], backgroundPowerW: 1e-6 }
const full = SimulationConfig.parse({
  waveguide: {
    ...chip,
    additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 }],
    forwardResonances: [{ frequencyMHz: 4350, linewidthMHz: 12, gainCoefficientMPerW: 2.6e-9 }],
  },
  channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 }, coProbe: cw, forwardInputs: [{ stokes: cw }] }],
  options: { cascade: { stokesOrders: 2, seedPowerW: 1e-9 } },
  windowNs: 20,
})
const plain = SimulationConfig.parse({ waveguide: chip, channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }], windowNs: 20 })

describe('sweepable fields of resonances, cascade and co-propagating probe', () => {
  it('joins the sweep field list with a label, a unit and a help text each', () => {
    for (const id of WAVE_SWEEP_FIELD_IDS) {
      expect(SWEEP_FIELD_IDS).toContain(id)
      const f = sweepField(id)
      expect(SWEEP_FIELDS).toContain(f)
      expect(f.label.length).toBeGreaterThan(3)
      expect(f.unit).toMatch(/^(GHz|MHz|W|m\/W)$/)
    }
  })

  it.each(WAVE_SWEEP_FIELD_IDS.map((id) => [id]))('%s: sets the value, reads it back, leaves the source alone and stays a valid run', (id) => {
    const before = readSweepValue(full, id)!
    const value = before * 1.5 + (before === 0 ? 1e-8 : 0)
    const swept = applySweepValue(full, id, value)
    expect(readSweepValue(swept, id)).toBe(value)
    expect(readSweepValue(full, id)).toBe(before)
    expect(fieldProblem(full, id)).toBeNull()
    expect(SimulationConfig.safeParse(swept).success).toBe(true)
  })

  it('says why a field cannot be swept on a plain pump–Stokes run', () => {
    expect(fieldProblem(plain, 'furtherResonanceShiftGHz')).toBe('The base waveguide has no further backward resonance')
    expect(fieldProblem(plain, 'forwardFrequencyMHz')).toBe('The base waveguide has no forward resonance')
    expect(fieldProblem(plain, 'cascadeSeedPowerW')).toMatch(/one Stokes order/)
    expect(fieldProblem(plain, 'coProbePowerW')).toBe('The base configuration has no co-propagating probe')
    expect(fieldProblem(plain, 'brillouinShiftGHz')).toBeNull()
  })
})
