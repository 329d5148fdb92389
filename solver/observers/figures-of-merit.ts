// Figures of merit from the full-resolution port traces (interleaved complex, √W) and the light left in
// the waveguide at the end. Energies are Σ|A(t_n)|²·Δt: the same sum the photon bookkeeping is exact in.
import type { SimulationConfig } from '@shared/simulation-config'
import type { ChannelFigures, FiguresOfMerit, WindowEnergy } from '@shared/simulation-result'
import { pulseAmplitude } from '../grid/input-traces'
import type { Model } from '../problem/coupled-modes'

export interface ChannelTraces {
  pumpIn: Float64Array
  stokesIn: Float64Array
  pumpOut: Float64Array
  stokesOut: Float64Array
}

/** Read-window margin in read-pulse widths on either side (common practice: catches > 99.9 % of a smooth pulse). */
const READ_WINDOW_WIDTHS = 3

const power = (a: Float64Array, n: number) => a[2 * n] * a[2 * n] + a[2 * n + 1] * a[2 * n + 1]

export function energyJ(a: Float64Array, dtS: number, n0 = 0, n1 = a.length / 2 - 1): number {
  let e = 0
  for (let n = Math.max(0, n0); n <= Math.min(a.length / 2 - 1, n1); n++) e += power(a, n)
  return e * dtS
}

function centroidS(a: Float64Array, dtS: number): number | null {
  let w = 0, s = 0
  for (let n = 0; n < a.length / 2; n++) {
    const p = power(a, n)
    w += p
    s += p * n
  }
  return w > 0 ? (s / w) * dtS : null
}

/** Power FWHM around the global maximum, linearly interpolated; null if the pulse is cut by the window. */
export function fwhmS(a: Float64Array, dtS: number): number | null {
  const N = a.length / 2
  let iMax = 0, pMax = 0
  for (let n = 0; n < N; n++) if (power(a, n) > pMax) (pMax = power(a, n)), (iMax = n)
  if (pMax <= 0) return null
  const half = pMax / 2
  let l = iMax
  while (l > 0 && power(a, l) > half) l--
  let r = iMax
  while (r < N - 1 && power(a, r) > half) r++
  if (power(a, l) > half || power(a, r) > half) return null
  const tl = l + (half - power(a, l)) / (power(a, l + 1) - power(a, l))
  const tr = r - (half - power(a, r)) / (power(a, r - 1) - power(a, r))
  return (tr - tl) * dtS
}

function maxPower(a: Float64Array): number {
  let m = 0
  for (let n = 0; n < a.length / 2; n++) m = Math.max(m, power(a, n))
  return m
}

export function computeFigures(
  config: SimulationConfig,
  model: Model,
  traces: ChannelTraces[],
  leftJ: { pump: number; stokes: number }[],
  wallTimeS: number,
  cellUpdates: number,
): FiguresOfMerit {
  const dt = model.dtS
  const transitS = model.nz * dt
  const r = model.rates.frequencyRatio
  const channels: ChannelFigures[] = traces.map((t, k) => {
    const e = { pumpIn: energyJ(t.pumpIn, dt), stokesIn: energyJ(t.stokesIn, dt), pumpOut: energyJ(t.pumpOut, dt), stokesOut: energyJ(t.stokesOut, dt) }
    const sIn = maxPower(t.stokesIn)
    const delay = (out: Float64Array, inp: Float64Array) => {
      const a = centroidS(out, dt), b = centroidS(inp, dt)
      return a !== null && b !== null ? (a - b - transitS) * 1e9 : null
    }
    const fw = (a: Float64Array) => {
      const f = fwhmS(a, dt)
      return f === null ? null : f * 1e9
    }
    let manleyRoweResidual: number | null = null
    const scale = e.pumpIn + r * e.stokesIn
    if (model.rates.alphaPerM === 0 && scale > 0) {
      const lostPump = e.pumpIn - e.pumpOut - leftJ[k].pump
      const gainedStokes = e.stokesOut + leftJ[k].stokes - e.stokesIn
      manleyRoweResidual = Math.abs(lostPump - r * gainedStokes) / scale
    }
    return {
      channel: k,
      energyJ: e,
      peakStokesGainDb: sIn > 0 ? 10 * Math.log10(maxPower(t.stokesOut) / sIn) : null,
      reflectivity: e.pumpIn > 0 ? e.stokesOut / e.pumpIn : null,
      pumpDelayNs: delay(t.pumpOut, t.pumpIn),
      stokesDelayNs: delay(t.stokesOut, t.stokesIn),
      pumpOutFwhmNs: fw(t.pumpOut),
      stokesOutFwhmNs: fw(t.stokesOut),
      manleyRoweResidual,
      ...retrieval(config, k, t.pumpOut, dt, transitS),
    }
  })
  const windows: WindowEnergy[] = config.energyWindows.map((w) => {
    const n0 = Math.ceil((w.startNs * 1e-9) / dt - 1e-9)
    const n1 = Math.floor((w.endNs * 1e-9) / dt + 1e-9)
    const per = traces.map((t) => energyJ(t[w.port], dt, n0, n1))
    return { label: w.label, port: w.port, startNs: w.startNs, endNs: w.endNs, energyJPerChannel: per, energyJ: per.reduce((a, b) => a + b, 0) }
  })
  return { channels, windows, wallTimeS, cellUpdatesPerS: wallTimeS > 0 ? cellUpdates / wallTimeS : 0 }
}

/**
 * Storage read-out: a pump-port pulse labelled "data" and a later Stokes-port pulse labelled "read". The
 * retrieved light leaves at z = L between the read pulse's entry and two transits later.
 */
function retrieval(config: SimulationConfig, k: number, pumpOut: Float64Array, dt: number, transitS: number) {
  const none = { retrievalEfficiency: null, retrievedPhaseRad: null, readWindowNs: null }
  const ch = config.channels[k]
  const data = ch.pump.pulses.find((p) => /data/i.test(p.label ?? ''))
  if (!data) return none
  const read = ch.stokes.pulses.filter((p) => /read/i.test(p.label ?? '') && p.centreNs > data.centreNs).sort((a, b) => a.centreNs - b.centreNs)[0]
  if (!read) return none
  const widthNs = 'fwhmNs' in read ? read.fwhmNs : read.sampleIntervalNs * read.powerShape.length
  const t0 = Math.max(0, read.centreNs - READ_WINDOW_WIDTHS * widthNs)
  const t1 = Math.min(config.windowNs, read.centreNs + 2 * transitS * 1e9 + READ_WINDOW_WIDTHS * widthNs)
  const n0 = Math.ceil((t0 * 1e-9) / dt)
  const n1 = Math.floor((t1 * 1e-9) / dt)
  let dataJ = 0
  for (let n = 0; n < pumpOut.length / 2; n++) {
    const a = pulseAmplitude(data, n * dt * 1e9)
    dataJ += data.peakPowerW * a * a * dt
  }
  if (dataJ <= 0) return none
  let sr = 0, si = 0
  for (let n = n0; n <= n1; n++) (sr += pumpOut[2 * n]), (si += pumpOut[2 * n + 1])
  const twoPi = 2 * Math.PI
  const phase = (((Math.atan2(si, sr) - data.phaseRad) % twoPi) + twoPi) % twoPi
  return { retrievalEfficiency: energyJ(pumpOut, dt, n0, n1) / dataJ, retrievedPhaseRad: phase, readWindowNs: [t0, t1] as [number, number] }
}
