/*
 * Normal deviates by the ziggurat method of Marsaglia & Tsang (2000, J. Stat. Softw. 5(8), "The Ziggurat
 * Method for Generating Random Variables"), 128 layers, on the xoshiro128** stream of SeededRandom
 * (Blackman & Vigna 2018). The density f(x) = e^{−x²/2} is covered by 127 rectangles of equal area v and a
 * base strip (a rectangle plus the tail beyond r); a layer i is picked by 7 bits of a 32-bit draw j, and
 *   x = j·w_i                  accepted at once when |j| < k_i (inside the layer above: 97.2 %, Σk_i/(128·2³¹)),
 *   else, layer 0 (the tail):  x = r + e₁/r with e₁, e₂ exponential, accepted when 2e₂ > (e₁/r)² (Marsaglia 1964),
 *   else (a wedge):            accepted when f_i + U·(f_{i−1} − f_i) < e^{−x²/2}, otherwise draw again.
 * Constants from the paper: r = 3.442619855899, v = 9.91256303526217e-3; the tables are built at load with
 * its recursion x_{i−1} = √(−2 ln(v/x_i + f(x_i))). Only 32-bit integer operations, IEEE doubles and V8's
 * Math.exp/log/sqrt are used, so a seed gives the same stream on every platform (as SeededRandom's polar method).
 * Cost: one 32-bit draw, one multiply and one compare per deviate on the fast path, against two 53-bit uniforms
 * (four draws), a log, a square root and a division per pair, with 21 % rejections, for the polar method.
 */
import { SeededRandom } from './seeded-random'

const LAYERS = 128
const R = 3.442619855899
const V = 9.91256303526217e-3
const M1 = 2147483648

/** k_i: acceptance bound on |j|; w_i: scale from j to x; f_i = e^{−x_i²/2} (the paper's kn, wn, fn). */
const KN = new Int32Array(LAYERS)
const WN = new Float64Array(LAYERS)
const FN = new Float64Array(LAYERS)
{
  let dn = R
  let tn = dn
  const q = V / Math.exp(-0.5 * dn * dn)
  KN[0] = Math.floor((dn / q) * M1)
  KN[1] = 0
  WN[0] = q / M1
  WN[LAYERS - 1] = dn / M1
  FN[0] = 1
  FN[LAYERS - 1] = Math.exp(-0.5 * dn * dn)
  for (let i = LAYERS - 2; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(V / dn + Math.exp(-0.5 * dn * dn)))
    KN[i + 1] = Math.floor((dn / tn) * M1)
    tn = dn
    FN[i] = Math.exp(-0.5 * dn * dn)
    WN[i] = dn / M1
  }
}
/** k_i and w_i interleaved, [k₀, w₀, k₁, w₁, …]: the fast path reads both from one cache line. */
const KW = new Float64Array(2 * LAYERS)
for (let i = 0; i < LAYERS; i++) {
  KW[2 * i] = KN[i]
  KW[2 * i + 1] = WN[i]
}

/** Seeded standard normal deviates by the ziggurat (the solver's default NormalSource). */
export class ZigguratNormal extends SeededRandom {
  override normal(): number {
    const j = this.nextInt32()
    const i = j & (LAYERS - 1)
    // |j| as a double: −2³¹ has no int32 magnitude, and is never below any k_i (all < 2³¹), so it falls to the slow path.
    if (Math.abs(j) < KN[i]) return j * WN[i]
    return this.slow(j, i)
  }

  /**
   * count deviates into out[0..count), the same numbers as count calls of normal(): the fast path with the
   * xoshiro128** state in local variables (the same steps as SeededRandom.nextInt32), the slow path as normal().
   */
  fill(out: Float64Array, count: number): void {
    const st = this.s
    let s0 = st[0], s1 = st[1], s2 = st[2], s3 = st[3]
    for (let k = 0; k < count; k++) {
      const m = Math.imul(s1, 5)
      const j = Math.imul((m << 7) | (m >>> 25), 9)
      const t = s1 << 9
      s2 ^= s0
      s3 ^= s1
      s1 ^= s2
      s0 ^= s3
      s2 ^= t
      s3 = (s3 << 11) | (s3 >>> 21)
      const i2 = (j & (LAYERS - 1)) << 1
      out[k] = j * KW[i2 + 1]
      if (Math.abs(j) < KW[i2]) continue
      st[0] = s0
      st[1] = s1
      st[2] = s2
      st[3] = s3
      out[k] = this.slow(j, i2 >> 1)
      s0 = st[0]
      s1 = st[1]
      s2 = st[2]
      s3 = st[3]
    }
    st[0] = s0
    st[1] = s1
    st[2] = s2
    st[3] = s3
  }

  /** Outside the rectangle: the tail (layer 0) or a wedge; on rejection a fresh draw from the top. */
  private slow(j: number, i: number): number {
    for (;;) {
      if (i === 0) {
        let x: number, y: number
        do {
          x = -Math.log(this.openUniform()) / R
          y = -Math.log(this.openUniform())
        } while (y + y < x * x)
        return j > 0 ? R + x : -R - x
      }
      const x = j * WN[i]
      if (FN[i] + this.uniform() * (FN[i - 1] - FN[i]) < Math.exp(-0.5 * x * x)) return x
      j = this.nextInt32()
      i = j & (LAYERS - 1)
      if (Math.abs(j) < KN[i]) return j * WN[i]
    }
  }

  /** Uniform in (0, 1): the log of the tail must not see 0. */
  private openUniform(): number {
    let u = this.uniform()
    while (u === 0) u = this.uniform()
    return u
  }
}
