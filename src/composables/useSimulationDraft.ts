import { computed, ref, type Ref } from 'vue'
import type { SpeedCalibration } from '@shared/physics/speed-calibration'
import { SimulationConfig, type SimulationConfigInput } from '@shared/physics/simulation-config'
import { Waveguide, type WaveguideInput } from '@shared/physics/waveguide'
import { deriveQuantities } from '@shared/physics/derived-quantities'
import { chooseGrid } from '@shared/physics/grid-step'
import { checkLimits, estimateResources } from '@shared/physics/resource-estimate'
import { issuesByPath } from '@/components/simulation/form-issues'
import { plainCopy } from '@/components/simulation/pulse-drafts'
import { startConfig } from '@/components/simulation/simulation-starts'

/**
 * The run being composed: the draft as typed, and everything that follows from it — the parsed config (null
 * while invalid), the schema's issues by field path, the grid, the resource estimate with its limit check and
 * the derived quantities with their advisories. One source of truth for the form, preview and side panels.
 * `calibration`: the server's measured speeds (useSpeedCalibration), for the expected time.
 */
export function useSimulationDraft(initial: SimulationConfigInput = startConfig(), calibration?: Readonly<Ref<SpeedCalibration | null>>) {
  const draft = ref<SimulationConfigInput>(plainCopy(initial))

  const parsed = computed(() => SimulationConfig.safeParse(draft.value))
  const config = computed(() => (parsed.value.success ? parsed.value.data : null))
  const issues = computed(() => (parsed.value.success ? {} : issuesByPath(parsed.value.error.issues)))
  const issueCount = computed(() => (parsed.value.success ? 0 : parsed.value.error.issues.length))

  // The waveguide alone parses while a pulse field is still wrong, so its derived values stay visible.
  const waveguide = computed(() => {
    const r = Waveguide.safeParse(draft.value.waveguide)
    return r.success ? r.data : null
  })
  const grid = computed(() => (config.value ? chooseGrid(config.value) : null))
  const estimate = computed(() => (config.value && grid.value ? estimateResources(config.value, grid.value, 1, calibration?.value) : null))
  const limitCheck = computed(() => (estimate.value ? checkLimits(estimate.value) : null))
  const derived = computed(() => (waveguide.value ? deriveQuantities({ waveguide: waveguide.value, config: config.value ?? undefined }) : null))

  function load(cfg: SimulationConfigInput) {
    draft.value = plainCopy(cfg)
  }
  function setWaveguide(w: WaveguideInput) {
    draft.value = { ...draft.value, waveguide: plainCopy(w) }
  }

  return { draft, parsed, config, issues, issueCount, waveguide, grid, estimate, limitCheck, derived, load, setWaveguide }
}
