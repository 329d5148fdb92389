/*
 * Seeded generator for the thermal Langevin source: xoshiro128** (Blackman & Vigna 2018, public domain
 * algorithm) seeded through splitmix32, and normal deviates by Marsaglia's polar method (no trig). The same
 * seed gives the same sequence on every platform: only 32-bit integer ops and IEEE doubles are used.
 */
export class SeededRandom {
  private s0: number
  private s1: number
  private s2: number
  private s3: number
  private spare = 0
  private hasSpare = false

  constructor(seed: number) {
    let x = seed >>> 0
    const next = () => {
      // splitmix32
      x = (x + 0x9e3779b9) >>> 0
      let z = x
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0
      return (z ^ (z >>> 16)) >>> 0
    }
    this.s0 = next()
    this.s1 = next()
    this.s2 = next()
    this.s3 = next()
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1
  }

  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5), 7), 9) >>> 0
    const t = this.s1 << 9
    this.s2 ^= this.s0
    this.s3 ^= this.s1
    this.s1 ^= this.s2
    this.s0 ^= this.s3
    this.s2 ^= t
    this.s3 = rotl(this.s3, 11)
    return result
  }

  /** Uniform in [0, 1) with 53 random bits. */
  uniform(): number {
    const hi = this.nextUint32() >>> 5
    const lo = this.nextUint32() >>> 6
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

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0
}
