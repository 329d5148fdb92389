// The cores of one process shared by its solver threads, so that a run takes a helper thread only while a
// core is free, and the runs-per-machine accounting stays honest (docs/numerics.md, "Threaded step").
// Int32 slots of a SharedArrayBuffer that every solver thread of the pool sees:
//   [0] threads computing (runs and their helpers), [1] cores, [2 + s] threads of solver thread s.
// A solver thread counts itself while it computes a run (enter/leave); a helper is counted when taken. The pool
// keeps the per-thread slots so that a solver thread it had to terminate gives back what it held (release).
export class CoreLease {
  private readonly counts: Int32Array

  constructor(
    buffer: SharedArrayBuffer,
    private readonly slot: number,
  ) {
    this.counts = new Int32Array(buffer)
  }

  /** A buffer for `threads` solver threads on `cores` cores, nothing computing. */
  static buffer(cores: number, threads: number): SharedArrayBuffer {
    const b = new SharedArrayBuffer(4 * (2 + threads))
    new Int32Array(b)[1] = cores
    return b
  }

  /** Threads computing now, in all solver threads. */
  get inUse(): number {
    return Atomics.load(this.counts, 0)
  }

  /** The solver thread starts a run. */
  enter(): void {
    this.add(1)
  }

  /** The solver thread's run is over. */
  leave(): void {
    this.add(-1)
  }

  /** Counts a helper if a core is free; false (nothing counted) otherwise. */
  tryTakeHelper(): boolean {
    const c = this.counts
    for (;;) {
      const used = Atomics.load(c, 0)
      if (used >= Atomics.load(c, 1)) return false
      if (Atomics.compareExchange(c, 0, used, used + 1) === used) {
        Atomics.add(c, 2 + this.slot, 1)
        return true
      }
    }
  }

  /** Counts a helper that was asked for by name (a forced thread count), free core or not. */
  takeHelper(): void {
    this.add(1)
  }

  giveHelper(): void {
    this.add(-1)
  }

  /** The pool, after solver thread `slot` ended: gives back whatever it still held. */
  static release(buffer: SharedArrayBuffer, slot: number): void {
    const c = new Int32Array(buffer)
    Atomics.sub(c, 0, Atomics.exchange(c, 2 + slot, 0))
  }

  private add(n: number): void {
    Atomics.add(this.counts, 2 + this.slot, n)
    Atomics.add(this.counts, 0, n)
  }
}
