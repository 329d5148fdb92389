// Numbers collected row by row into fixed-size typed blocks, so a column of n samples costs 8·n bytes
// (plus at most one part-filled block) while it grows, instead of a JS array's slack and boxing.

const BLOCK = 32 * 1024

class Blocks<T extends Float64Array | Int32Array> {
  private readonly full: T[] = []
  private current: T
  private used = 0

  constructor(private readonly make: (n: number) => T) {
    this.current = make(BLOCK)
  }

  push(v: number): void {
    if (this.used === BLOCK) {
      this.full.push(this.current)
      this.current = this.make(BLOCK)
      this.used = 0
    }
    this.current[this.used++] = v
  }

  /** One array of the exact length; the blocks are let go as they are copied. */
  finish(length: number): T {
    const out = this.make(length)
    let at = 0
    for (const b of this.full.splice(0)) {
      out.set(b, at)
      at += b.length
    }
    out.set(this.current.subarray(0, this.used), at)
    this.current = this.make(0)
    return out
  }
}

export class ColumnStore {
  rowCount = 0
  private readonly columns: Blocks<Float64Array>[]
  private readonly lines = new Blocks((n) => new Int32Array(n))

  constructor(readonly columnCount: number) {
    this.columns = Array.from({ length: columnCount }, () => new Blocks((n) => new Float64Array(n)))
  }

  /** Adds one row; `values` holds one number per column. */
  push(values: ArrayLike<number>, lineNo: number): void {
    for (let c = 0; c < this.columnCount; c++) this.columns[c].push(values[c])
    this.lines.push(lineNo)
    this.rowCount++
  }

  finish(): { data: Float64Array[]; rowLines: Int32Array } {
    return { data: this.columns.map((c) => c.finish(this.rowCount)), rowLines: this.lines.finish(this.rowCount) }
  }
}
