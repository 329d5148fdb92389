/*
 * A small seeded generator for shared/ (no Math.random): the same seed gives the same sequence in the browser
 * and in the worker. xoshiro128** (Blackman & Vigna 2018, public-domain algorithm) seeded through splitmix32;
 * normal deviates by Marsaglia's polar method. Only 32-bit integer operations and IEEE doubles are used, so
 * the sequence is the same bit for bit on every platform.
 */
export class SeededNormal {
  // Int32Array state: values above 2³¹ would otherwise be boxed doubles in object fields (slow).
  protected readonly s = new Int32Array(4)
  protected spare = 0
  protected hasSpare = false

  constructor(seed: number) {
    let x = seed | 0
    for (let i = 0; i < 4; i++) {
      // splitmix32: spreads a small seed over the whole state
      x = (x + 0x9e3779b9) | 0
      let z = x
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b)
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35)
      this.s[i] = z ^ (z >>> 16)
    }
    if ((this.s[0] | this.s[1] | this.s[2] | this.s[3]) === 0) this.s[0] = 1
  }

  /** Next 32 random bits as a signed int32. */
  nextInt32(): number {
    const s = this.s
    const m = Math.imul(s[1], 5)
    const result = Math.imul((m << 7) | (m >>> 25), 9)
    const t = s[1] << 9
    s[2] ^= s[0]
    s[3] ^= s[1]
    s[1] ^= s[2]
    s[0] ^= s[3]
    s[2] ^= t
    s[3] = (s[3] << 11) | (s[3] >>> 21)
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
    let u: number, v: number, q: number
    do {
      u = 2 * this.uniform() - 1
      v = 2 * this.uniform() - 1
      q = u * u + v * v
    } while (q >= 1 || q === 0)
    const f = Math.sqrt((-2 * Math.log(q)) / q)
    this.spare = v * f
    this.hasSpare = true
    return u * f
  }
}
