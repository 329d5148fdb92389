/*
 * Seeded generator for the thermal Langevin source: the shared xoshiro128** stream with polar-method normals
 * (shared/physics/seeded-normal.ts), which a forked run can continue from its parent's state.
 */
import { SeededNormal } from '@shared/physics/seeded-normal'

export class SeededRandom extends SeededNormal implements NormalSource {
  /** Continue from another generator's state: a forked run then draws the same noise as its parent. */
  copyFrom(other: SeededRandom): void {
    this.s.set(other.s)
    this.spare = other.spare
    this.hasSpare = other.hasSpare
  }
}

/** What the kernels need of a generator: standard normal deviates, one per call. */
export interface NormalSource {
  normal(): number
  /** Optional bulk form: out[0..count) gets exactly what `count` calls of normal() would return, in order. */
  fill?(out: Float64Array, count: number): void
}

/** count deviates of `rng` into out[0..count), in the order of count calls of normal() (its bulk form if it has one). */
export function drawNormals(rng: NormalSource, out: Float64Array, count: number): void {
  if (rng.fill) rng.fill(out, count)
  else for (let k = 0; k < count; k++) out[k] = rng.normal()
}
