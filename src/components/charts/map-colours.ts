// Colour scale of the space–time maps: a ramp of our own from deep ink through sea teal and sand to paper,
// rising in lightness all the way, so a brighter pixel always means more (and a grey print keeps the order).

export type ColourScale = 'linear' | 'log'

/** [position 0..1, r, g, b]. */
export const MAP_RAMP: ReadonlyArray<readonly [number, number, number, number]> = [
  [0, 0x0b, 0x14, 0x22],
  [0.22, 0x1d, 0x3a, 0x5c],
  [0.45, 0x1f, 0x75, 0x7a],
  [0.68, 0x7d, 0xa8, 0x7b],
  [0.86, 0xe0, 0xc8, 0x7f],
  [1, 0xfd, 0xf6, 0xe3],
]

export const LUT_SIZE = 256

/** 256 RGB triples sampled from the ramp by linear interpolation. */
export function buildLut(ramp = MAP_RAMP): Uint8Array {
  const lut = new Uint8Array(LUT_SIZE * 3)
  for (let i = 0; i < LUT_SIZE; i++) {
    const t = i / (LUT_SIZE - 1)
    let k = 0
    while (k < ramp.length - 2 && t > ramp[k + 1][0]) k++
    const [t0, r0, g0, b0] = ramp[k]
    const [t1, r1, g1, b1] = ramp[k + 1]
    const f = t1 > t0 ? (t - t0) / (t1 - t0) : 0
    lut[3 * i] = Math.round(r0 + f * (r1 - r0))
    lut[3 * i + 1] = Math.round(g0 + f * (g1 - g0))
    lut[3 * i + 2] = Math.round(b0 + f * (b1 - b0))
  }
  return lut
}

export const DEFAULT_LUT = buildLut()

/** CSS gradient of the same ramp, bottom = low, for the colour bar. */
export const rampCss = (ramp = MAP_RAMP) =>
  `linear-gradient(to top, ${ramp.map(([t, r, g, b]) => `rgb(${r} ${g} ${b}) ${(t * 100).toFixed(0)}%`).join(', ')})`

export interface ColourRange {
  min: number
  max: number
}

/**
 * The range the colours span. Linear: 0 (or the lowest value, when negative) to the highest. Log: the
 * highest value down `decades` decades; anything at or below the floor takes the lowest colour.
 */
export function colourRange(values: ArrayLike<number>, scale: ColourScale, decades = 4, filled?: Uint8Array, cols = 1): ColourRange {
  let lo = Infinity
  let hi = -Infinity
  for (let i = 0; i < values.length; i++) {
    if (filled && !filled[Math.floor(i / cols)]) continue
    const v = values[i]
    if (!Number.isFinite(v)) continue
    if (v < lo) lo = v
    if (v > hi) hi = v
  }
  if (!Number.isFinite(hi)) return scale === 'log' ? { min: 10 ** -decades, max: 1 } : { min: 0, max: 1 }
  if (scale === 'log') {
    const max = hi > 0 ? hi : 1
    return { min: max * 10 ** -decades, max }
  }
  const min = Math.min(0, lo)
  return { min, max: hi > min ? hi : min + 1 }
}

/** Position 0..1 of a value on the scale (clamped). */
export function scalePosition(v: number, range: ColourRange, scale: ColourScale): number {
  let t: number
  if (scale === 'log') t = v > 0 ? (Math.log10(v) - Math.log10(range.min)) / (Math.log10(range.max) - Math.log10(range.min)) : 0
  else t = (v - range.min) / (range.max - range.min)
  return t <= 0 || !Number.isFinite(t) ? 0 : t >= 1 ? 1 : t
}

/**
 * RGBA pixels of a rows × cols map (row 0 at the top). Rows not yet filled stay transparent, so a live map
 * shows where the solver has got to.
 */
export function paintMap(
  values: ArrayLike<number>,
  rows: number,
  cols: number,
  range: ColourRange,
  scale: ColourScale,
  filled?: Uint8Array,
  lut: Uint8Array = DEFAULT_LUT,
): Uint8ClampedArray {
  const out = new Uint8ClampedArray(rows * cols * 4)
  for (let r = 0; r < rows; r++) {
    if (filled && !filled[r]) continue
    for (let c = 0; c < cols; c++) {
      const i = r * cols + c
      const k = Math.round(scalePosition(values[i], range, scale) * (LUT_SIZE - 1)) * 3
      out[4 * i] = lut[k]
      out[4 * i + 1] = lut[k + 1]
      out[4 * i + 2] = lut[k + 2]
      out[4 * i + 3] = 255
    }
  }
  return out
}

export interface PlotRect {
  left: number
  top: number
  width: number
  height: number
}

/** The map cell under a point in the chart's pixel space, or null outside the plot. */
export function cellAt(x: number, y: number, rect: PlotRect, rows: number, cols: number): { row: number; col: number } | null {
  const fx = (x - rect.left) / rect.width
  const fy = (y - rect.top) / rect.height
  if (!(fx >= 0 && fx < 1 && fy >= 0 && fy < 1) || rows === 0 || cols === 0) return null
  return { row: Math.floor(fy * rows), col: Math.floor(fx * cols) }
}
