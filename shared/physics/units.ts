// Unit conversions used by the form, the API and the solver. Names carry the unit they return.

/** Optical power loss: dB/m = 10·log10(e)·α ≈ 4.343·α (α in 1/m). */
export const DB_PER_NEPER_POWER = 10 / Math.LN10

export const dbPerMToPerM = (lossDbPerM: number): number => lossDbPerM / DB_PER_NEPER_POWER
export const perMToDbPerM = (alphaPerM: number): number => alphaPerM * DB_PER_NEPER_POWER

export const nsToS = (ns: number): number => ns * 1e-9
export const psToS = (ps: number): number => ps * 1e-12
export const sToNs = (s: number): number => s * 1e9
export const mhzToHz = (mhz: number): number => mhz * 1e6
export const ghzToHz = (ghz: number): number => ghz * 1e9
export const um2ToM2 = (um2: number): number => um2 * 1e-12
export const nmToM = (nm: number): number => nm * 1e-9

/** Angular frequency (rad/s) from a frequency in Hz. */
export const hzToRadPerS = (hz: number): number => 2 * Math.PI * hz

export const wattsToDbm = (powerW: number): number => 10 * Math.log10(powerW / 1e-3)
export const ratioToDb = (ratio: number): number => 10 * Math.log10(ratio)
