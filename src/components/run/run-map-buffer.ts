// The three live space–time maps of one run, assembled from streamed row blocks. Blocks may arrive twice
// (a reconnect replays from Last-Event-ID), out of order, or from an attempt that a lost worker left
// behind; each of those must leave the maps as if only the current attempt's blocks had come, once each.
import type { RunBlockEvent } from '@shared/api/runs'

export const MAP_KEYS = ['pumpPowerW', 'stokesPowerW', 'acousticPhononsPerM'] as const
export type MapKey = (typeof MAP_KEYS)[number]

/** Float32 values from base64 of little-endian bytes (every browser we serve is little-endian). */
export function decodeFloat32Base64(b64: string): Float32Array {
  const bin = atob(b64)
  const bytes = new Uint8Array(bin.length)
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i)
  const view = new DataView(bytes.buffer)
  const out = new Float32Array(bytes.length >> 2)
  for (let i = 0; i < out.length; i++) out[i] = view.getFloat32(4 * i, true)
  return out
}

export class RunMapBuffer {
  attempt = 0
  rows: number
  cols: number
  maps: Record<MapKey, Float32Array>
  /** 1 where a row has arrived; the painter leaves the other rows blank. */
  filled: Uint8Array
  rowsFilled = 0
  private seen = new Set<number>()

  /** `rows`/`cols` are what the run is expected to produce; blocks outside them grow the buffer. */
  constructor(rows = 0, cols = 0) {
    this.rows = rows
    this.cols = cols
    this.maps = this.blank(rows, cols)
    this.filled = new Uint8Array(rows)
  }

  private blank(rows: number, cols: number): Record<MapKey, Float32Array> {
    return { pumpPowerW: new Float32Array(rows * cols), stokesPowerW: new Float32Array(rows * cols), acousticPhononsPerM: new Float32Array(rows * cols) }
  }

  /** Forgets everything (a new attempt draws its maps from row 0 again). */
  reset(attempt: number): void {
    this.attempt = attempt
    this.maps = this.blank(this.rows, this.cols)
    this.filled = new Uint8Array(this.rows)
    this.rowsFilled = 0
    this.seen.clear()
  }

  /** A status event told us the attempt; a newer one drops what the older left. */
  noteAttempt(attempt: number): void {
    if (attempt > this.attempt) this.reset(attempt)
  }

  private resize(rows: number, cols: number): void {
    const old = this.maps
    const oldFilled = this.filled
    const oldCols = this.cols
    this.maps = this.blank(rows, cols)
    this.filled = new Uint8Array(rows)
    if (cols === oldCols) {
      for (const k of MAP_KEYS) this.maps[k].set(old[k].subarray(0, Math.min(old[k].length, rows * cols)))
      this.filled.set(oldFilled.subarray(0, Math.min(oldFilled.length, rows)))
    } else {
      // Column count changed: earlier rows cannot be placed; start over for this attempt.
      this.seen.clear()
    }
    this.rows = rows
    this.cols = cols
    this.rowsFilled = this.filled.reduce((n, f) => n + f, 0)
  }

  /** Applies one block; returns whether the maps changed. */
  apply(block: RunBlockEvent): boolean {
    if (block.attempt < this.attempt) return false
    if (block.attempt > this.attempt) this.reset(block.attempt)
    if (this.seen.has(block.blockIndex)) return false
    const end = block.rowStart + block.rowCount
    if (block.cols !== this.cols || end > this.rows) this.resize(Math.max(end, this.rows), block.cols)
    const n = block.rowCount * block.cols
    for (const k of MAP_KEYS) {
      const values = decodeFloat32Base64(block.maps[k])
      if (values.length !== n) return false
      this.maps[k].set(values, block.rowStart * block.cols)
    }
    for (let r = block.rowStart; r < end; r++) {
      if (!this.filled[r]) this.rowsFilled++
      this.filled[r] = 1
    }
    this.seen.add(block.blockIndex)
    return true
  }
}
