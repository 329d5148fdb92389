// Samples the configured port inputs on the time grid t_n = n·Δt, n = 0..nt, as complex envelopes (√W).
import type { PortInput } from '@shared/pulse'
import { pulseAmplitude } from '@shared/pulse-envelope'

export { pulseAmplitude }

/**
 * Interleaved complex trace of one port. The continuous background adds coherently (it is leakage of the
 * same laser through the modulator) with phase 0. A pulse carries e^{i(φ − 2πδ(t − t₀))}: the phase is
 * the carrier phase at the pulse centre, and a spectral offset +δ gives an envelope ∝ e^{−iδt} (brief §1).
 */
export function sampleInput(port: PortInput, nt: number, dtS: number): Float64Array {
  const out = new Float64Array(2 * (nt + 1))
  const bg = Math.sqrt(port.backgroundPowerW)
  const dtNs = dtS * 1e9
  for (let n = 0; n <= nt; n++) out[2 * n] = bg
  for (const p of port.pulses) {
    const amp = Math.sqrt(p.peakPowerW)
    const w = 2 * Math.PI * p.frequencyOffsetMHz * 1e-3 // rad/ns
    for (let n = 0; n <= nt; n++) {
      const tNs = n * dtNs
      const a = amp * pulseAmplitude(p, tNs)
      if (a === 0) continue
      const ph = p.phaseRad - w * (tNs - p.centreNs)
      out[2 * n] += a * Math.cos(ph)
      out[2 * n + 1] += a * Math.sin(ph)
    }
  }
  return out
}
