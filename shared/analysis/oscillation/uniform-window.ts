// The analysed part of a record on a uniform time grid (linear interpolation), times from the window start.

export interface UniformWindow {
  startNs: number
  endNs: number
  samples: number
  stepNs: number
  /** Samples in the window before thinning, when there were more than allowed. */
  thinnedFrom: number | null
  t: Float64Array
  /** Null when fewer than 16 samples fall in the window. */
  y: Float64Array | null
}

const MIN_SAMPLES = 16

function resample(t: ArrayLike<number>, y: ArrayLike<number>, t0: number, dt: number, n: number): Float64Array {
  const out = new Float64Array(n)
  let j = 0
  for (let i = 0; i < n; i++) {
    const ti = t0 + i * dt
    while (j < t.length - 2 && t[j + 1] < ti) j++
    const span = t[j + 1] - t[j]
    const w = span > 0 ? Math.min(1, Math.max(0, (ti - t[j]) / span)) : 0
    out[i] = y[j] * (1 - w) + y[j + 1] * w
  }
  return out
}

export function uniformWindow(timeNs: ArrayLike<number>, values: ArrayLike<number>, fromNs: number | undefined, toNs: number | undefined, maxSamples: number): UniformWindow {
  const first = timeNs[0]
  const last = timeNs[timeNs.length - 1]
  const startNs = Math.max(first, fromNs ?? first)
  const endNs = Math.min(last, toNs ?? last)
  let inside = 0
  for (let i = 0; i < timeNs.length; i++) if (timeNs[i] >= startNs && timeNs[i] <= endNs) inside++
  if (inside < MIN_SAMPLES || !(endNs > startNs)) return { startNs, endNs, samples: inside, stepNs: 0, thinnedFrom: null, t: new Float64Array(0), y: null }
  const n = Math.min(inside, maxSamples)
  const stepNs = (endNs - startNs) / (n - 1)
  return {
    startNs,
    endNs,
    samples: n,
    stepNs,
    thinnedFrom: inside > n ? inside : null,
    t: Float64Array.from({ length: n }, (_, i) => i * stepNs),
    y: resample(timeNs, values, startNs, stepNs, n),
  }
}
