// Types for fft.js 4 (a radix-4 FFT of power-of-two size; complex arrays interleave re, im).
declare module 'fft.js' {
  export default class FFT {
    constructor(size: number)
    readonly size: number
    createComplexArray(): number[]
    toComplexArray(input: ArrayLike<number>, storage?: number[]): number[]
    fromComplexArray(complex: ArrayLike<number>, storage?: number[]): number[]
    /** Fills only the left half of `out` for real input; completeSpectrum mirrors it. */
    realTransform(out: number[], data: ArrayLike<number>): void
    completeSpectrum(spectrum: number[]): void
    transform(out: number[], data: ArrayLike<number>): void
    inverseTransform(out: number[], data: ArrayLike<number>): void
  }
}
