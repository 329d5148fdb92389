// Decimated space–time maps (rows = time, cols = z) of pump power, Stokes power and phonon density,
// summed over channels, reduced by block max or mean. Memory is O(rows·cols), independent of the grid.
import type { Model } from '../problem/coupled-modes'
import type { FieldState } from '../steppers/interaction-kernel'

/** Time samples taken inside one row block: a few evenly spaced steps resolve any pulse the Δt rules allow. */
const MAX_SAMPLES_PER_ROW = 4

export interface MapLayout {
  rows: number
  cols: number
  rowSteps: number
  colNodes: number
  samplesPerRow: number
  sampleStride: number
}

export function mapLayout(nt: number, nodes: number, wantRows: number, wantCols: number): MapLayout {
  const samples = nt + 1
  const rowSteps = Math.ceil(samples / Math.min(wantRows, samples))
  const rows = Math.ceil(samples / rowSteps)
  const colNodes = Math.ceil(nodes / Math.min(wantCols, nodes))
  const cols = Math.ceil(nodes / colNodes)
  const sampleStride = Math.max(1, Math.floor(rowSteps / MAX_SAMPLES_PER_ROW))
  return { rows, cols, rowSteps, colNodes, samplesPerRow: Math.ceil(rowSteps / sampleStride), sampleStride }
}

/** What the recorder reads of a model: P_p = kappaP·|u|², P_s = rates.kappa·|v|², phonons = |b|²/stokesPhotonJ. */
export type MapScales = Pick<Model, 'nodes' | 'nCh' | 'nt' | 'kappaP' | 'stokesPhotonJ'> & { rates: { kappa: number } }

export class MapRecorder {
  readonly pumpPowerW: Float32Array
  readonly stokesPowerW: Float32Array
  /** Phonons per metre, |b|²/(ħω_s). */
  readonly acousticPhononsPerM: Float32Array
  rowsDone = 0
  private accP: Float64Array
  private accS: Float64Array
  private accB: Float64Array
  private samplesInRow = 0

  constructor(
    readonly layout: MapLayout,
    private readonly model: MapScales,
    private readonly useMax: boolean,
  ) {
    const n = layout.rows * layout.cols
    this.pumpPowerW = new Float32Array(n)
    this.stokesPowerW = new Float32Array(n)
    this.acousticPhononsPerM = new Float32Array(n)
    this.accP = new Float64Array(layout.cols)
    this.accS = new Float64Array(layout.cols)
    this.accB = new Float64Array(layout.cols)
  }

  /**
   * Called after time sample n is complete. `sampledElsewhere`: the threaded engine has already added this
   * step's sample to the shared accumulators (shareAccumulators), column by column in the same order.
   */
  record(n: number, s: FieldState, sampledElsewhere = false): void {
    const L = this.layout
    const inRow = n % L.rowSteps
    if (inRow % L.sampleStride === 0) {
      if (sampledElsewhere) this.samplesInRow++
      else this.sample(s)
    }
    const last = inRow === L.rowSteps - 1 || n === this.model.nt
    if (last) this.flushRow()
  }

  /** Whether record(n) takes a sample: 0 no, 1 added to the row's, 2 the row's first (the sums start at 0). */
  sampleAt(n: number): 0 | 1 | 2 {
    const L = this.layout
    if ((n % L.rowSteps) % L.sampleStride !== 0) return 0
    return this.samplesInRow === 0 ? 2 : 1
  }

  /** Moves the column accumulators into shared memory, for a sampler on other threads: [P, S, B], cols each. */
  shareAccumulators(): Float64Array {
    const cols = this.layout.cols
    const all = new Float64Array(new SharedArrayBuffer(8 * 3 * cols))
    all.set(this.accP, 0)
    all.set(this.accS, cols)
    all.set(this.accB, 2 * cols)
    this.accP = all.subarray(0, cols)
    this.accS = all.subarray(cols, 2 * cols)
    this.accB = all.subarray(2 * cols)
    return all
  }

  /** What a sampler elsewhere needs to add a column's sample as sample() does (one channel). */
  get samplerSettings(): { cols: number; colNodes: number; kp: number; ks: number; kb: number; useMax: boolean } {
    const m = this.model
    return { cols: this.layout.cols, colNodes: this.layout.colNodes, kp: m.kappaP, ks: m.rates.kappa, kb: 1 / m.stokesPhotonJ, useMax: this.useMax }
  }

  private sample(s: FieldState): void {
    const m = this.model
    const { uRe, uIm, vRe, vIm, bRe, bIm } = s
    const kp = m.kappaP, ks = m.rates.kappa, kb = 1 / m.stokesPhotonJ
    const cn = this.layout.colNodes
    const accP = this.accP, accS = this.accS, accB = this.accB
    const first = this.samplesInRow === 0
    for (let c = 0; c < this.layout.cols; c++) {
      const j0 = c * cn
      const j1 = Math.min(m.nodes, j0 + cn)
      let sp = first ? 0 : accP[c], ss = first ? 0 : accS[c], sb = first ? 0 : accB[c]
      for (let j = j0; j < j1; j++) {
        let p = 0, q = 0, b = 0
        for (let k = 0; k < m.nCh; k++) {
          const i = k * m.nodes + j
          p += kp * (uRe[i] * uRe[i] + uIm[i] * uIm[i])
          q += ks * (vRe[i] * vRe[i] + vIm[i] * vIm[i])
          b += kb * (bRe[i] * bRe[i] + bIm[i] * bIm[i])
        }
        if (this.useMax) {
          if (p > sp) sp = p
          if (q > ss) ss = q
          if (b > sb) sb = b
        } else {
          sp += p
          ss += q
          sb += b
        }
      }
      accP[c] = sp
      accS[c] = ss
      accB[c] = sb
    }
    this.samplesInRow++
  }

  private flushRow(): void {
    const L = this.layout
    const r = this.rowsDone
    const m = this.model
    for (let c = 0; c < L.cols; c++) {
      let scale = 1
      if (!this.useMax) {
        const nodesInCol = Math.min(m.nodes, (c + 1) * L.colNodes) - c * L.colNodes
        scale = 1 / (nodesInCol * Math.max(1, this.samplesInRow))
      }
      this.pumpPowerW[r * L.cols + c] = this.accP[c] * scale
      this.stokesPowerW[r * L.cols + c] = this.accS[c] * scale
      this.acousticPhononsPerM[r * L.cols + c] = this.accB[c] * scale
    }
    this.samplesInRow = 0
    this.rowsDone++
  }
}
