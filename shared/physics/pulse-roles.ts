/*
 * What each launched pulse is for, and when its light is expected at each port. Figures of merit are
 * measured in windows that follow these arrivals, so they stay right when a sweep moves a pulse.
 *
 * Geometry (docs/model.md, conventions): the pump enters at z = 0 and
 * leaves at z = L; the Stokes enters at z = L and leaves at z = 0; both travel at v_g, transit T = L·n_g/c.
 *
 * Storage read-out: a data pulse (pump port, entering at t_d) meets a write pulse (Stokes port, entering
 * at t_w) where t_d + z/v_g = t_w + (L − z)/v_g, i.e. at z_g = (L + v_g(t_w − t_d))/2. A read pulse
 * entering at t_r reaches z_g at t_r + (L − z_g)/v_g, and the light it scatters into the pump wave leaves
 * at z = L another (L − z_g)/v_g later:
 *     t_echo = t_r + 2(L − z_g)/v_g = t_r + T − (t_w − t_d).
 * For Gaussian envelopes the grating is the cross-correlation of data and write, and the echo its
 * convolution with the read pulse, so the echo's power FWHM is √(F_d² + F_w² + F_r²).
 */
import type { Pulse } from './pulse'
import type { Channel, Port, SimulationConfig } from './simulation-config'
import type { Waveguide } from './waveguide'
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'

export const RUN_SCHEMES = ['storage', 'amplifier', 'generator', 'other'] as const
/** storage: data + read pulses; amplifier: pump and Stokes launched; generator: pump only (Stokes grows from noise). */
export type RunScheme = (typeof RUN_SCHEMES)[number]

export const transitNs = (w: Pick<Waveguide, 'lengthM' | 'groupIndex'>) => ((w.lengthM * w.groupIndex) / SPEED_OF_LIGHT_M_PER_S) * 1e9

/** Power FWHM (ns); for a sampled pulse, measured on its samples (linear interpolation). */
export function pulseFwhmNs(p: Pulse): number {
  if (p.shape !== 'sampled') return p.fwhmNs
  const s = p.powerShape
  const peak = Math.max(...s)
  if (!(peak > 0)) return p.sampleIntervalNs
  const half = peak / 2
  const first = s.findIndex((v) => v >= half)
  let last = s.length - 1
  while (last > 0 && s[last] < half) last--
  const left = first > 0 ? first - 1 + (half - s[first - 1]) / (s[first] - s[first - 1]) : 0
  const right = last < s.length - 1 ? last + (s[last] - half) / (s[last] - s[last + 1]) : s.length - 1
  return Math.max(p.sampleIntervalNs, (right - left) * p.sampleIntervalNs)
}

const isRole = (p: Pulse, role: string) => new RegExp(role, 'i').test(p.label ?? '')

export interface StorageRoles {
  data: Pulse
  /** The write pulse that meets the data (closest in time before the read); null if none is labelled. */
  write: Pulse | null
  read: Pulse
  /** Index of the read pulse among the channel's Stokes pulses. */
  readIndex: number
}

/** Data = first pump pulse labelled "data"; read = first later Stokes pulse labelled "read". */
export function storageRoles(ch: Pick<Channel, 'pump' | 'stokes'>): StorageRoles | null {
  const data = ch.pump.pulses.find((p) => isRole(p, 'data'))
  if (!data) return null
  const reads = ch.stokes.pulses.map((p, i) => ({ p, i })).filter(({ p }) => isRole(p, 'read') && p.centreNs > data.centreNs)
  if (reads.length === 0) return null
  const { p: read, i: readIndex } = reads.reduce((a, b) => (b.p.centreNs < a.p.centreNs ? b : a))
  const writes = ch.stokes.pulses.filter((p) => isRole(p, 'write') && p.centreNs < read.centreNs)
  const write = writes.length ? writes.reduce((a, b) => (Math.abs(b.centreNs - data.centreNs) < Math.abs(a.centreNs - data.centreNs) ? b : a)) : null
  return { data, write, read, readIndex }
}

export function channelScheme(ch: Pick<Channel, 'pump' | 'stokes'>): RunScheme {
  if (storageRoles(ch)) return 'storage'
  const pump = ch.pump.pulses.length > 0 || ch.pump.backgroundPowerW > 0
  const stokes = ch.stokes.pulses.length > 0 || ch.stokes.backgroundPowerW > 0
  return pump && stokes ? 'amplifier' : pump ? 'generator' : 'other'
}

/** The run's scheme: storage if any channel stores, else the first channel's. */
export function runScheme(config: Pick<SimulationConfig, 'channels'>): RunScheme {
  const schemes = config.channels.map(channelScheme)
  return schemes.includes('storage') ? 'storage' : (schemes[0] ?? 'other')
}

/** Where and how wide light is expected at a port. */
export interface Arrival {
  arrivalNs: number
  fwhmNs: number
}

/** The retrieved (read-out) pulse at the pump output. Without a write pulse the grating may sit anywhere: the whole transit. */
export function echoArrival(r: StorageRoles, tNs: number): Arrival {
  const fr = pulseFwhmNs(r.read)
  if (!r.write) return { arrivalNs: r.read.centreNs + tNs, fwhmNs: Math.hypot(fr, tNs) }
  const fd = pulseFwhmNs(r.data), fw = pulseFwhmNs(r.write)
  return { arrivalNs: r.read.centreNs + tNs - (r.write.centreNs - r.data.centreNs), fwhmNs: Math.sqrt(fd * fd + fw * fw + fr * fr) }
}

export type PulsePort = 'pump' | 'stokes'

/**
 * Expected arrival of one launched pulse's light at a port: at its own input port when launched, at its
 * own output port one transit later; the storage read pulse at the pump output is its echo; light a pulse
 * scatters into the other wave leaves at the facet it enters through, so at once.
 */
export function pulseArrival(ch: Pick<Channel, 'pump' | 'stokes'>, port: PulsePort, index: number, at: Port, tNs: number): Arrival | null {
  const p = ch[port].pulses[index]
  if (!p) return null
  const own = { arrivalNs: p.centreNs, fwhmNs: pulseFwhmNs(p) }
  const later = { ...own, arrivalNs: p.centreNs + tNs }
  if (port === 'pump') return at === 'pumpOut' || at === 'stokesIn' ? later : own
  if (at === 'stokesOut' || at === 'pumpIn') return later
  if (at === 'pumpOut') {
    const roles = storageRoles(ch)
    if (roles && roles.readIndex === index) return echoArrival(roles, tNs)
  }
  return own
}

/** A read pulse starts to matter this many FWHM before its centre (Gaussian power there: 2^−36). */
export const READ_LEAD_FWHM = 3

/**
 * When the first storage read pulse starts to enter (ns), or null without storage: from then on a storage
 * run also integrates its reference without the read pulses (solver/storage-reference.ts).
 */
export function storageReferenceStartNs(config: Pick<SimulationConfig, 'channels'>): number | null {
  let startNs = Infinity
  for (const ch of config.channels) {
    const r = storageRoles(ch)?.read
    if (!r) continue
    const lead = r.shape === 'sampled' ? ((r.powerShape.length - 1) * r.sampleIntervalNs) / 2 : READ_LEAD_FWHM * pulseFwhmNs(r)
    startNs = Math.min(startNs, r.centreNs - lead)
  }
  return Number.isFinite(startNs) ? startNs : null
}

/** Time index at which the storage reference is forked on a grid of step dtS. */
export const storageForkStep = (startNs: number, dtS: number) => Math.max(0, Math.floor((startNs * 1e-9) / dtS))

/** Short name of a pulse for messages: its label, or "pump pulse 2". */
export const pulseName = (ch: Pick<Channel, 'pump' | 'stokes'>, port: PulsePort, index: number) =>
  ch[port].pulses[index]?.label?.trim() || `${port === 'pump' ? 'pump' : 'Stokes'} pulse ${index + 1}`
