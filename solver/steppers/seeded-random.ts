/*
 * Seeded generator for the thermal Langevin source: xoshiro128** (Blackman & Vigna 2018, public domain
 * algorithm) seeded through splitmix32, and normal deviates by Marsaglia's polar method (no trig). The same
 * seed gives the same sequence on every platform: only 32-bit integer ops and IEEE doubles are used.
 */
export class SeededRandom implements NormalSource {
  // Int32Array state: values above 2³¹ would otherwise be boxed doubles in object fields (slow).
  protected readonly s = new Int32Array(4)
  private spare = 0
  private hasSpare = false

  constructor(seed: number) {
    let x = seed | 0
    const next = () => {
      // splitmix32
      x = (x + 0x9e3779b9) | 0
      let z = x
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b)
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35)
      return z ^ (z >>> 16)
    }
    for (let i = 0; i < 4; i++) this.s[i] = next()
    if ((this.s[0] | this.s[1] | this.s[2] | this.s[3]) === 0) this.s[0] = 1
  }

  /** Continue from another generator's state: a forked run then draws the same noise as its parent. */
  copyFrom(other: SeededRandom): void {
    this.s.set(other.s)
    this.spare = other.spare
    this.hasSpare = other.hasSpare
  }

  /** Next 32 random bits as a signed int32 (xoshiro128**). */
  nextInt32(): number {
    const s = this.s
    const s1 = s[1]
    const m = Math.imul(s1, 5)
    const result = Math.imul((m << 7) | (m >>> 25), 9)
    const t = s1 << 9
    s[2] ^= s[0]
    s[3] ^= s[1]
    s[1] ^= s[2]
    s[0] ^= s[3]
    s[2] ^= t
    const s3 = s[3]
    s[3] = (s3 << 11) | (s3 >>> 21)
    return result
  }

  /** Uniform in [0, 1) with 53 random bits. */
  uniform(): number {
    const hi = this.nextInt32() >>> 5
    const lo = this.nextInt32() >>> 6
    return (hi * 67108864 + lo) / 9007199254740992
  }

  /** Standard normal deviate (mean 0, variance 1). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false
      return this.spare
    }
    let u: number, v: number, s: number
    do {
      u = 2 * this.uniform() - 1
      v = 2 * this.uniform() - 1
      s = u * u + v * v
    } while (s >= 1 || s === 0)
    const f = Math.sqrt((-2 * Math.log(s)) / s)
    this.spare = v * f
    this.hasSpare = true
    return u * f
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
