import { watch, type Ref } from 'vue'
import type { FitPort } from '@shared/api/fits'
import type { Series } from '@shared/analysis/trace-align'
import { fetchRunArray } from '@/api/runs'
import { useAsync } from '@/composables/useAsync'

const PORT_ARRAY: Record<FitPort, string> = { pumpOut: 'pump_out', stokesOut: 'stokes_out' }

/** A finished run's output power |A|² (W) at one port and channel, reloaded when they change. */
export function useRunOutput(runId: Ref<string>, port: Ref<FitPort>, channel: Ref<number>) {
  const load = useAsync(async (id: string, p: FitPort, ch: number): Promise<Series> => {
    const [t, a] = await Promise.all([fetchRunArray(id, 'time_ns'), fetchRunArray(id, `ch${ch + 1}_${PORT_ARRAY[p]}`)])
    const values = new Float64Array(a.data.length / 2)
    for (let i = 0; i < values.length; i++) values[i] = a.data[2 * i] ** 2 + a.data[2 * i + 1] ** 2
    return { timeNs: t.data, values }
  })
  watch(
    [runId, port, channel],
    ([id, p, ch]) => {
      // No stale curve under a new port or channel while it loads, nor after a failure.
      load.data.value = null
      void load.run(id, p, ch)
    },
    { immediate: true },
  )
  return { series: load.data, error: load.error }
}
