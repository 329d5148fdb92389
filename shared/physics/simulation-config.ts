import { z } from 'zod'
import { Waveguide } from './waveguide'
import { PortInput, type Pulse } from './pulse'
import { waveSetIssues } from './wave-set-rules'
import { truncationMessage } from './pulse-truncation'
import { MIN_TIME_STEP_PS, MIN_WINDOW_NS, MIN_WINDOW_STEPS } from './grid-limits'
import { safeText } from '../api/text'
import { sourceStepProblem } from './source-grid-rules'
import { sourceLimitIssues } from './source-limits'
import { profileIssues } from './profile-grid-rules'
import { CascadeSettings } from './resonances'

const finite = () => z.number().finite()

export const PORTS = ['pumpIn', 'stokesIn', 'pumpOut', 'stokesOut'] as const
/** pumpIn/pumpOut: z = 0 / z = L for the forward wave; stokesIn/stokesOut: z = L / z = 0 for the backward wave. */
export const Port = z.enum(PORTS)
export type Port = z.infer<typeof Port>

/** What is launched at z = 0 into the forward Stokes (ν_p − ν_F) and anti-Stokes (ν_p + ν_F) waves of one forward resonance. */
export const ForwardInputs = z.object({
  stokes: PortInput.default({ pulses: [], backgroundPowerW: 0 }).describe('Forward Stokes wave, ν_p − ν_F, launched at z = 0'),
  antiStokes: PortInput.default({ pulses: [], backgroundPowerW: 0 }).describe('Forward anti-Stokes wave, ν_p + ν_F, launched at z = 0'),
})
export type ForwardInputs = z.infer<typeof ForwardInputs>

/**
 * One pump–Stokes pair with its own acoustic grating. Channel 1 is the reference (offsetGHz = 0);
 * another channel's pump and Stokes carriers are both shifted by offsetGHz.
 */
export const Channel = z.object({
  label: safeText().trim().max(60).optional(),
  offsetGHz: finite().min(-1e4).max(1e4).default(0).describe('Carrier offset from channel 1, same for pump and Stokes (GHz)'),
  pump: PortInput.default({ pulses: [], backgroundPowerW: 0 }).describe('Forward wave, launched at z = 0'),
  stokes: PortInput.default({ pulses: [], backgroundPowerW: 0 }).describe('Backward wave, launched at z = L'),
  coProbe: PortInput.optional().describe('Probe at the Stokes frequency launched at z = 0 with the pump (co-propagating): sees no backward gain'),
  forwardInputs: z
    .array(ForwardInputs)
    .max(3)
    .default([])
    .describe('Inputs of the forward Stokes and anti-Stokes waves, one entry per forward resonance of the waveguide'),
})
export type Channel = z.infer<typeof Channel>

export const MapReduction = z.enum(['max', 'mean'])

export const GridSettings = z.object({
  timeStepPs: finite().min(MIN_TIME_STEP_PS, `must be at least ${MIN_TIME_STEP_PS} ps`).max(1e6).optional().describe('Time step Δt (ps); Δz = v_g·Δt. Chosen from the step rules when absent'),
  mapRows: z.number().int().min(16).max(1024).default(512).describe('Rows (time samples) kept in each space–time map'),
  mapCols: z.number().int().min(16).max(1024).default(512).describe('Columns (z samples) kept in each space–time map'),
  mapReduction: MapReduction.default('max').describe('How grid cells are merged into one map pixel'),
})
export type GridSettings = z.infer<typeof GridSettings>

export const NoiseSettings = z.object({
  enabled: z.boolean().default(false),
  temperatureK: finite().positive().max(2000).default(295).describe('Temperature of the acoustic bath (K)'),
  seed: z.number().int().min(0).max(2 ** 31 - 1).default(1).describe('Seed of the random generator; the same seed gives the same run'),
  zeroPoint: z
    .boolean()
    .default(false)
    .describe('Spontaneous Stokes emission from n_th + 1 phonons instead of n_th (the zero-point term; matters when n_th is small)'),
})

export const SimulationOptions = z.object({
  higherOrderAcoustic: z.boolean().default(false).describe('Keep ∂²b/∂t² in the acoustic equation (pulses near the acoustic period)'),
  kerr: z.boolean().default(false).describe('Self- and cross-phase modulation from n₂'),
  acousticAdvection: z.boolean().default(false).describe('Sound travels along z at v_A'),
  noise: NoiseSettings.default({ enabled: false, temperatureK: 295, seed: 1, zeroPoint: false }),
  cascade: CascadeSettings.default({ stokesOrders: 1, seedPowerW: 0 }),
  forwardAntiStokes: z.boolean().default(true).describe('Include the forward anti-Stokes wave of each forward resonance'),
  errorEstimate: z.boolean().default(true).describe('Repeat the run on the grid with twice the time step (+25 % compute) to estimate each figure’s numerical error'),
  /** Replaces ω_p/ω_s in the pump equation; for checking photon bookkeeping only. */
  frequencyRatioOverride: finite().min(0.1).max(10).optional(),
})
export type SimulationOptions = z.infer<typeof SimulationOptions>

/**
 * Ties an energy window to a launched pulse: the window runs from fromFwhm to toFwhm widths around the
 * pulse's expected arrival at the window's port (shared/physics/pulse-roles.ts), so it follows the pulse in a sweep.
 */
export const PulseAnchor = z.object({
  channel: z.number().int().min(0).max(7).default(0).describe('Channel of the pulse (0 = first)'),
  port: z.enum(['pump', 'stokes']).describe('Port the pulse is launched into'),
  pulseIndex: z.number().int().min(0).max(1999).describe("Which of that port's pulses (0 = first)"),
  fromFwhm: finite().min(-1000).max(1000).default(-2).describe('Window start, in widths from the expected arrival'),
  toFwhm: finite().min(-1000).max(1000).default(2).describe('Window end, in widths from the expected arrival'),
})
export type PulseAnchor = z.infer<typeof PulseAnchor>

/** A user-marked window over which the energy through one port is reported: fixed times, or anchored to a pulse. */
export const EnergyWindow = z
  .object({
    label: safeText().trim().min(1, 'must not be empty').max(60),
    port: Port,
    startNs: finite().optional(),
    endNs: finite().optional(),
    anchor: PulseAnchor.optional(),
  })
  .superRefine((w, ctx) => {
    if (w.anchor) {
      if (!(w.anchor.toFwhm > w.anchor.fromFwhm)) ctx.addIssue({ code: 'custom', path: ['anchor', 'toFwhm'], message: 'The window must end after it starts' })
      return
    }
    if (w.startNs === undefined) ctx.addIssue({ code: 'custom', path: ['startNs'], message: 'Give a start time or anchor the window to a pulse' })
    if (w.endNs === undefined) ctx.addIssue({ code: 'custom', path: ['endNs'], message: 'Give an end time or anchor the window to a pulse' })
    if (w.startNs !== undefined && w.endNs !== undefined && !(w.endNs > w.startNs)) ctx.addIssue({ code: 'custom', path: ['endNs'], message: 'The window must end after it starts' })
  })
export type EnergyWindow = z.infer<typeof EnergyWindow>

export const SIMULATION_SCHEMA_VERSION = 1

export const SimulationConfigBase = z.object({
  schemaVersion: z.literal(SIMULATION_SCHEMA_VERSION).default(SIMULATION_SCHEMA_VERSION),
  waveguide: Waveguide,
  channels: z.array(Channel).min(1).max(8),
  detuningMHz: finite().min(-1e5).max(1e5).default(0).describe('(ν_p − ν_s) − ν_B (MHz)'),
  windowNs: finite().min(MIN_WINDOW_NS, `must be at least ${MIN_WINDOW_NS} ns`).max(1e7).describe('Simulated time span (ns), starting at 0'),
  grid: GridSettings.default({ mapRows: 512, mapCols: 512, mapReduction: 'max' }),
  options: SimulationOptions.default({
    higherOrderAcoustic: false,
    kerr: false,
    acousticAdvection: false,
    noise: { enabled: false, temperatureK: 295, seed: 1, zeroPoint: false },
    cascade: { stokesOrders: 1, seedPowerW: 0 },
    forwardAntiStokes: true,
    errorEstimate: true,
  }),
  energyWindows: z.array(EnergyWindow).max(50).default([]),
})

/** Shortest time feature of a pulse (ns): what the time step has to resolve. */
export function pulseFeatureNs(p: Pulse): number {
  switch (p.shape) {
    case 'rectangular':
      return Math.min(p.fwhmNs, p.riseNs)
    case 'sampled':
      return p.sampleIntervalNs
    default:
      return p.fwhmNs
  }
}

/** The whole run description: what the form edits, the API stores and the worker integrates. */
export const SimulationConfig = SimulationConfigBase.superRefine((c, ctx) => {
  c.channels.forEach((ch, ci) => {
    const inputs: [(string | number)[], PortInput | undefined][] = [
      [['pump'], ch.pump],
      [['stokes'], ch.stokes],
      [['coProbe'], ch.coProbe],
      ...ch.forwardInputs.flatMap((f, fi): [(string | number)[], PortInput][] => [
        [['forwardInputs', fi, 'stokes'], f.stokes],
        [['forwardInputs', fi, 'antiStokes'], f.antiStokes],
      ]),
    ]
    for (const [at, input] of inputs) {
      input?.pulses.forEach((p, pi) => {
        const path = ['channels', ci, ...at, 'pulses', pi, 'centreNs']
        if (p.centreNs < 0 || p.centreNs > c.windowNs) {
          ctx.addIssue({ code: 'custom', path, message: `The pulse centre must lie inside the simulated window, 0 to ${c.windowNs} ns` })
        } else {
          const cut = truncationMessage(p, c.windowNs)
          if (cut) ctx.addIssue({ code: 'custom', path, message: cut })
        }
      })
    }
  })
  for (const issue of waveSetIssues(c)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message })
  for (const issue of profileIssues(c)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message })
  // Cross beats between channels are dropped; that holds only far from the gain line.
  const linewidthGHz = c.waveguide.linewidthMHz / 1000
  for (let i = 0; i < c.channels.length; i++) {
    for (let j = i + 1; j < c.channels.length; j++) {
      if (Math.abs(c.channels[i].offsetGHz - c.channels[j].offsetGHz) < 10 * linewidthGHz) {
        ctx.addIssue({
          code: 'custom',
          path: ['channels', j, 'offsetGHz'],
          message: `Channels must be at least 10 linewidths apart (${(10 * linewidthGHz).toPrecision(3)} GHz)`,
        })
      }
    }
  }
  c.energyWindows.forEach((w, wi) => {
    if (w.anchor) {
      // An anchored window that leaves the run is reported as not determined after the run, not refused:
      // a sweep moving the pulse must still queue every point.
      const a = w.anchor
      if (!c.channels[a.channel]) ctx.addIssue({ code: 'custom', path: ['energyWindows', wi, 'anchor', 'channel'], message: `There is no channel ${a.channel + 1}` })
      else if (!c.channels[a.channel][a.port].pulses[a.pulseIndex])
        ctx.addIssue({ code: 'custom', path: ['energyWindows', wi, 'anchor', 'pulseIndex'], message: `Channel ${a.channel + 1} has no ${a.port === 'pump' ? 'pump' : 'Stokes'} pulse ${a.pulseIndex + 1}` })
      return
    }
    if (w.startNs === undefined || w.endNs === undefined) return
    if (w.startNs < 0 || w.endNs > c.windowNs) {
      ctx.addIssue({ code: 'custom', path: ['energyWindows', wi, 'startNs'], message: `The window must lie within 0 to ${c.windowNs} ns` })
    }
  })
  if (c.options.higherOrderAcoustic && c.grid.timeStepPs !== undefined) {
    // The second-order acoustic equation resolves the carrier at ν_B: Δt ≤ 1/(20 ν_B).
    const maxPs = 1000 / (20 * c.waveguide.brillouinShiftGHz)
    if (c.grid.timeStepPs > maxPs) {
      ctx.addIssue({ code: 'custom', path: ['grid', 'timeStepPs'], message: `With the higher-order acoustic term the step must be ≤ ${maxPs.toPrecision(3)} ps (1/(20 ν_B))` })
    }
  }
  for (const issue of sourceLimitIssues(c)) ctx.addIssue({ code: 'custom', ...issue })
  if (c.grid.timeStepPs !== undefined) {
    const coarse = sourceStepProblem(c, c.grid.timeStepPs)
    if (coarse) ctx.addIssue({ code: 'custom', path: ['grid', 'timeStepPs'], message: coarse })
  }
  if (c.grid.timeStepPs !== undefined && (c.windowNs * 1000) / c.grid.timeStepPs < MIN_WINDOW_STEPS) {
    ctx.addIssue({
      code: 'custom',
      path: ['windowNs'],
      message: `The window must hold at least ${MIN_WINDOW_STEPS} time steps: with a ${c.grid.timeStepPs} ps step it must be at least ${((MIN_WINDOW_STEPS * c.grid.timeStepPs) / 1000).toPrecision(3)} ns`,
    })
  }
  if (c.grid.timeStepPs !== undefined) {
    const features = c.channels.flatMap((ch) => [ch.pump, ch.stokes, ch.coProbe, ...ch.forwardInputs.flatMap((f) => [f.stokes, f.antiStokes])].flatMap((p) => p?.pulses ?? [])).map(pulseFeatureNs)
    if (features.length > 0) {
      const shortestNs = Math.min(...features)
      const cells = shortestNs / (c.grid.timeStepPs / 1000)
      if (cells < 4) {
        ctx.addIssue({
          code: 'custom',
          path: ['grid', 'timeStepPs'],
          message: `The grid is too coarse: the shortest pulse feature (${shortestNs} ns) spans ${cells.toFixed(1)} steps; use a step ≤ ${((shortestNs * 1000) / 10).toPrecision(3)} ps`,
        })
      }
    }
  }
})
export type SimulationConfig = z.infer<typeof SimulationConfig>
export type SimulationConfigInput = z.input<typeof SimulationConfig>
