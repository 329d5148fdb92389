import { onScopeDispose, ref, shallowRef, watch, type Ref } from 'vue'
import { SEGMENTS_PER_CALL, SpectrumAccumulator, type SpectrumResult } from '@shared/analysis/power-spectrum'
import type { ChannelTraces, PortKey } from './useRun'

/** Work per slice before the page gets the main thread back (ms); a frame is ~16 ms. */
const SLICE_MS = 12

const nextTask = () => new Promise<void>((resolve) => setTimeout(resolve, 0))

/**
 * The power spectrum of one port trace of the loaded channel, computed in slices of SLICE_MS so a long trace
 * never freezes the page; a new port or channel abandons the computation under way.
 */
export function usePortSpectrum(traces: Ref<ChannelTraces | null>, port: Ref<PortKey>) {
  const spectrum = shallowRef<SpectrumResult | null>(null)
  const progress = ref(0)
  const error = ref<string | null>(null)
  let generation = 0

  async function compute(t: ChannelTraces, p: PortKey, mine: number) {
    const n = t.timeNs.length
    const dtS = n > 1 ? ((t.timeNs[n - 1] - t.timeNs[0]) / (n - 1)) * 1e-9 : NaN
    const acc = new SpectrumAccumulator(t.ports[p], dtS)
    while (!acc.done) {
      const start = performance.now()
      while (!acc.done && performance.now() - start < SLICE_MS) acc.advance(SEGMENTS_PER_CALL)
      progress.value = acc.progress
      if (!acc.done) await nextTask()
      if (mine !== generation) return
    }
    spectrum.value = acc.result()
  }

  watch(
    [traces, port],
    ([t, p]) => {
      const mine = ++generation
      spectrum.value = null
      error.value = null
      progress.value = 0
      if (!t) return
      compute(t, p, mine).catch(() => {
        if (mine === generation) error.value = 'The spectrum of this trace could not be computed: its time axis or values are not usable.'
      })
    },
    { immediate: true },
  )
  onScopeDispose(() => generation++)
  return { spectrum, progress, error }
}
