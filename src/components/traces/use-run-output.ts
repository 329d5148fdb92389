import { ref, shallowRef, watch, type Ref } from 'vue'
import type { FitPort } from '@shared/fits'
import type { Series } from '@shared/trace-align'
import { ApiError } from '@/api/client'
import { fetchRunArray } from '@/api/runs'

const PORT_ARRAY: Record<FitPort, string> = { pumpOut: 'pump_out', stokesOut: 'stokes_out' }

/** A finished run's output power |A|² (W) at one port and channel, reloaded when they change. */
export function useRunOutput(runId: Ref<string>, port: Ref<FitPort>, channel: Ref<number>) {
  const series = shallowRef<Series | null>(null)
  const error = ref<ApiError | null>(null)
  watch(
    [runId, port, channel],
    async ([id, p, ch]) => {
      error.value = null
      try {
        const [t, a] = await Promise.all([fetchRunArray(id, 'time_ns'), fetchRunArray(id, `ch${ch + 1}_${PORT_ARRAY[p]}`)])
        const values = new Float64Array(a.data.length / 2)
        for (let i = 0; i < values.length; i++) values[i] = a.data[2 * i] ** 2 + a.data[2 * i + 1] ** 2
        series.value = { timeNs: t.data, values }
      } catch (e) {
        series.value = null
        error.value = e instanceof ApiError ? e : new ApiError(0, 'client', String(e))
      }
    },
    { immediate: true },
  )
  return { series, error }
}
